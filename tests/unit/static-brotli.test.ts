// The app server's brotli answers for build scripts: the body decodes (with Node's zlib, which
// wraps Google's brotli library) to the file's exact bytes, and the headers say what a cache needs.
import { mkdirSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { brotliDecompressSync } from "node:zlib";
import { describe, expect, it } from "vitest";
// @ts-expect-error a plain .mjs script without type declarations
import { acceptsBrotli, serveStaticBrotli } from "../../scripts/static-brotli.mjs";

function fakeResponse() {
  const out: { status?: number; headers?: Record<string, unknown>; body?: Buffer } = {};
  return {
    out,
    writeHead(status: number, headers: Record<string, unknown>) { out.status = status; out.headers = headers; },
    end(body?: Buffer) { out.body = body; },
  };
}

const dir = mkdtempSync(path.join(tmpdir(), "cuspal-static-"));
mkdirSync(path.join(dir, "chunks"));
const script = Buffer.from(`console.log(${JSON.stringify("é".repeat(2000))});\n`.repeat(20));
writeFileSync(path.join(dir, "chunks", "a1.js"), script);
writeFileSync(path.join(dir, "chunks", "b.png"), "not text");
const req = (url: string, encoding = "gzip, deflate, br", method = "GET") => ({ method, url, headers: { "accept-encoding": encoding } });

describe("brotli for static build files", () => {
  it("answers a script with brotli that decodes to the same bytes, with length, Vary and immutable caching", () => {
    for (let round = 0; round < 2; round++) { // the second answer comes from the kept .br file
      const res = fakeResponse();
      expect(serveStaticBrotli(req("/_next/static/chunks/a1.js?v=1"), res, dir)).toBe(true);
      expect(res.out.status).toBe(200);
      expect(res.out.headers).toMatchObject({ "Content-Encoding": "br", Vary: "Accept-Encoding", "Content-Type": "application/javascript; charset=utf-8", "Cache-Control": "public, max-age=31536000, immutable" });
      expect(res.out.headers?.["Content-Length"]).toBe(res.out.body?.length);
      expect(res.out.body!.length).toBeLessThan(script.length);
      expect(brotliDecompressSync(res.out.body!).equals(script)).toBe(true);
    }
  });

  it("a HEAD gets the headers without a body", () => {
    const res = fakeResponse();
    expect(serveStaticBrotli(req("/_next/static/chunks/a1.js", "br", "HEAD"), res, dir)).toBe(true);
    expect(res.out.body).toBeUndefined();
    expect(res.out.headers?.["Content-Length"]).toBeGreaterThan(0);
  });

  it("leaves to Next what it should not answer", () => {
    const cases = [
      req("/_next/static/chunks/a1.js", "gzip, deflate"), // no br
      req("/_next/static/chunks/a1.js", "br;q=0, gzip"), // br refused
      req("/_next/static/chunks/a1.js", "gzip", "POST"),
      req("/_next/static/chunks/missing.js"),
      req("/_next/static/chunks/b.png"), // not a script or style
      req("/_next/static/..%2F..%2Fetc%2Fpasswd.js"), // outside the folder
      req("/sign-in"),
    ];
    for (const r of cases) expect(serveStaticBrotli(r, fakeResponse(), dir), r.url).toBe(false);
  });

  it("reads Accept-Encoding as RFC 9110 §12.5.3 says: listed and q > 0 ([P] RFC 9110)", () => {
    expect(acceptsBrotli("gzip, deflate, br, zstd")).toBe(true);
    expect(acceptsBrotli("BR;q=0.5")).toBe(true);
    expect(acceptsBrotli("br;q=0")).toBe(false);
    expect(acceptsBrotli("gzip")).toBe(false);
    expect(acceptsBrotli(undefined)).toBe(false);
  });
});
