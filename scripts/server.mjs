// Serves the built app (what `npm start`, `npm run demo` and `npm run serve` run). Next's own `next start` only fills in
// X-Forwarded-For when the request lacks it, so a client could name any address; here the
// socket's address is always appended as the last hop, and lib/server/client-ip.ts walks the
// header from the right, believing earlier hops only from the proxies listed in TRUSTED_PROXIES.
// Static scripts and styles go out brotli-compressed when the browser takes it (static-brotli.mjs);
// API answers are compressed whole, here, not by Next (api-answer-encoding.mjs).
import { createServer } from "node:http";
import path from "node:path";
import next from "next";
import { encodeApiAnswers } from "./api-answer-encoding.mjs";
import { serveStaticBrotli } from "./static-brotli.mjs";

const port = Number(process.env.PORT ?? 3000);
const args = process.argv.slice(2);
const flag = (name) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
};
const listenPort = Number(flag("-p") ?? port);
// Like `next start`: every interface unless -H names one.
const listenHost = flag("-H");

const app = next({ dev: false, hostname: listenHost ?? "localhost", port: listenPort });
await app.prepare();
const handle = app.getRequestHandler();
const staticDir = path.resolve(process.env.NEXT_DIST_DIR || ".next", "static");

const server = createServer((req, res) => {
  const peer = req.socket.remoteAddress ?? "unknown";
  const incoming = req.headers["x-forwarded-for"];
  const chain = Array.isArray(incoming) ? incoming.join(", ") : incoming;
  req.headers["x-forwarded-for"] = chain ? `${chain}, ${peer}` : peer;
  // X-Real-IP is not ours to read; drop it so nothing downstream mistakes it for the client.
  delete req.headers["x-real-ip"];
  if (serveStaticBrotli(req, res, staticDir)) return;
  encodeApiAnswers(req, res);
  handle(req, res);
}).listen(listenPort, listenHost, () => {
  console.log(`Cuspal is listening on port ${listenPort}`);
});

// A load balancer stops an instance with SIGTERM: finish the requests in flight, then exit (so a
// --cpu-prof profile is written too). Idle keep-alive connections are closed at once.
for (const signal of ["SIGTERM", "SIGINT"]) {
  process.once(signal, () => {
    server.close(() => process.exit(0));
    server.closeIdleConnections();
    setTimeout(() => process.exit(0), 5000).unref();
  });
}
