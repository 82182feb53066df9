// Brotli for the build's immutable scripts and styles (/_next/static/*.js, *.css). Next compresses
// with gzip only; brotli makes the framework's scripts about 14% smaller. Each file is compressed
// once, on first request, and kept beside it as `<file>.br` (build files never change under their
// name), so nothing lives in one process's memory and two servers sharing a build agree.
import { existsSync, readFileSync, renameSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { brotliCompressSync, constants } from "node:zlib";
import { codingWeights } from "./accept-encoding.mjs";

const TYPES = { ".js": "application/javascript; charset=utf-8", ".css": "text/css; charset=utf-8" };
const PREFIX = "/_next/static/";

/** Whether an Accept-Encoding header takes `br` (RFC 9110 §12.5.3: listed, and not with q=0). */
export function acceptsBrotli(header) {
  return (codingWeights(header).get("br") ?? 0) > 0;
}

function compressed(file) {
  const br = `${file}.br`;
  if (existsSync(br) && statSync(br).mtimeMs >= statSync(file).mtimeMs) return readFileSync(br);
  const body = brotliCompressSync(readFileSync(file), { params: { [constants.BROTLI_PARAM_QUALITY]: 11 } });
  try {
    // A temporary name, then a rename: another server reading the same build never sees half a file.
    const tmp = `${br}.${process.pid}.tmp`;
    writeFileSync(tmp, body);
    renameSync(tmp, br);
  } catch {
    // A read-only build folder: compress again next time.
  }
  return body;
}

/** Answers a request for a static script or style with its brotli form; false when that does not apply. */
export function serveStaticBrotli(req, res, staticDir) {
  if (req.method !== "GET" && req.method !== "HEAD") return false;
  const { pathname } = new URL(req.url ?? "/", "http://localhost");
  const type = TYPES[path.extname(pathname)];
  if (!pathname.startsWith(PREFIX) || !type || !acceptsBrotli(req.headers["accept-encoding"])) return false;
  let file;
  try {
    file = path.resolve(staticDir, decodeURIComponent(pathname.slice(PREFIX.length)));
  } catch {
    return false;
  }
  if (!file.startsWith(path.resolve(staticDir) + path.sep) || !existsSync(file) || !statSync(file).isFile()) return false;
  const body = compressed(file);
  res.writeHead(200, {
    "Content-Type": type,
    "Content-Encoding": "br",
    "Content-Length": body.length,
    Vary: "Accept-Encoding",
    "Cache-Control": "public, max-age=31536000, immutable",
  });
  res.end(req.method === "HEAD" ? undefined : body);
  return true;
}
