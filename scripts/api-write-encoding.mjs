// Answers to API writes (POST, PUT, PATCH, DELETE) are a few hundred bytes of JSON: an id and a
// status, or an error with a few alternatives. Next pipes every streamed answer through a gzip
// stream of its own whenever the client accepts gzip (it cannot see the size first), which cost
// about 2 ms of CPU per booking request for a few hundred bytes saved: most of what a lost booking
// race costs the server. So for those requests the server asks Next for the plain answer. Reads
// (GET), pages and build files are compressed as before.
const WRITES = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/** Whether a request is an API write, whose small answer goes out uncompressed. */
export function isApiWrite(method, url) {
  return WRITES.has(String(method).toUpperCase()) && /^\/api\//.test(String(url));
}

/** Drops Accept-Encoding from an API write, so Next answers it without a gzip stream. */
export function plainAnswerForApiWrites(req) {
  if (isApiWrite(req.method, req.url)) delete req.headers["accept-encoding"];
}
