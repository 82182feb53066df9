// API answers are compressed here, whole, rather than by Next. Next pipes every streamed answer
// through a gzip stream of its own whenever the client accepts gzip, even a 20-byte one (it cannot
// see the size first), and it drops a route's own Content-Encoding, so a route cannot do better
// itself. That stream cost about 2 ms of CPU per answer: a third of a lost booking's cost, and more
// than the availability search's own computation. So for /api/ requests the server hides
// Accept-Encoding from Next, keeps a JSON answer until it is complete (they are small and built in
// memory), and gzips it in one call when it is 1 kB or more. Other answers (PDFs, ZIP files,
// uploads' downloads) stream through untouched.
import { gzipSync } from "node:zlib";
import { codingWeights } from "./accept-encoding.mjs";

const JSON_TYPE = /^application\/(?:[\w.+-]+\+)?json\b/i;
/** Below this, gzip saves less than its own header and the work. */
export const COMPRESS_FROM_BYTES = 1024;

/** Whether an Accept-Encoding header lets us answer with gzip (RFC 9110 §12.5.3: q=0 refuses; a
 *  coding's own entry outranks `*`). */
export function acceptsGzip(header) {
  const weights = codingWeights(header);
  return (weights.get("gzip") ?? weights.get("x-gzip") ?? weights.get("*") ?? 0) > 0;
}

/** Sets up `res` so that an /api/ answer is encoded as described above; other requests are untouched. */
export function encodeApiAnswers(req, res) {
  if (!/^\/api\//.test(req.url ?? "")) return;
  const gzip = acceptsGzip(req.headers["accept-encoding"]) && req.method !== "HEAD";
  delete req.headers["accept-encoding"];
  const { flushHeaders, writeHead, write, end } = res;
  const chunks = [];
  let keep;
  let head = null;
  // Decided once, when the answer's headers are set and its first bytes (or its end) arrive.
  const keeping = () => (keep ??= !res.headersSent && !res.getHeader("content-encoding") && JSON_TYPE.test(String(res.getHeader("content-type") ?? "")));
  res.flushHeaders = function () {
    if (!keeping()) return flushHeaders.call(this);
  };
  // Next's own layers call writeHead (directly or through `_implicitHeader`) before the body: held
  // back until the end, when the length and encoding are known.
  res.writeHead = function (...args) {
    if (!keeping()) return writeHead.apply(this, args);
    head = args;
    return this;
  };
  res.write = function (chunk, encoding, callback) {
    if (!keeping()) return write.call(this, chunk, encoding, callback);
    chunks.push(typeof chunk === "string" ? Buffer.from(chunk, typeof encoding === "string" ? encoding : "utf8") : Buffer.from(chunk));
    const done = typeof encoding === "function" ? encoding : callback;
    if (done) process.nextTick(done);
    return true;
  };
  res.end = function (chunk, encoding, callback) {
    if (typeof chunk === "function") [chunk, encoding, callback] = [undefined, undefined, chunk];
    else if (typeof encoding === "function") [encoding, callback] = [undefined, encoding];
    if (!keeping()) return end.call(this, chunk, encoding, callback);
    if (chunk) chunks.push(typeof chunk === "string" ? Buffer.from(chunk, encoding ?? "utf8") : Buffer.from(chunk));
    let body = Buffer.concat(chunks);
    const vary = String(res.getHeader("vary") ?? "");
    if (!/accept-encoding/i.test(vary)) res.setHeader("Vary", vary ? `${vary}, Accept-Encoding` : "Accept-Encoding");
    if (gzip && body.length >= COMPRESS_FROM_BYTES) {
      body = gzipSync(body);
      res.setHeader("Content-Encoding", "gzip");
    }
    // 204 and 304 carry no body and no length (RFC 9110 §8.6).
    const status = head?.[0] ?? res.statusCode;
    if (status !== 204 && status !== 304) res.setHeader("Content-Length", body.length);
    writeHead.apply(this, head ?? [res.statusCode]);
    return end.call(this, body, callback);
  };
}
