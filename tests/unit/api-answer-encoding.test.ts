// The server's encoding of API answers, over a real node:http server whose handler writes the way
// Next's pipeToNodeResponse does (setHeader, flushHeaders, write, end). Decoding is checked with
// node:zlib (RFC 1952 gzip) as the reference.
import { createServer, request, type IncomingMessage, type Server, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { gunzipSync } from "node:zlib";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
// @ts-expect-error scripts/*.mjs are plain JavaScript, without type declarations
import { acceptsGzip, COMPRESS_FROM_BYTES, encodeApiAnswers } from "../../scripts/api-answer-encoding.mjs";

const big = JSON.stringify({ slots: Array.from({ length: 120 }, (_, i) => ({ start: `2027-03-${String(1 + (i % 28)).padStart(2, "0")}T08:${String(i % 60).padStart(2, "0")}:00-05:00` })) });
let seenEncoding: string | undefined;

function nextLike(req: IncomingMessage, res: ServerResponse) {
  seenEncoding = req.headers["accept-encoding"];
  const url = new URL(req.url!, "http://x");
  const send = (type: string, chunks: (string | Uint8Array)[], status = 200) => {
    res.statusCode = status;
    res.setHeader("content-type", type);
    res.setHeader("vary", "rsc");
    res.flushHeaders();
    // Next's compression layer writes the head itself before the first chunk, unless it went out.
    const raw = res as unknown as { _header: unknown; _implicitHeader(): void };
    if (!raw._header) raw._implicitHeader();
    for (const c of chunks) res.write(c);
    res.end();
  };
  if (url.pathname === "/api/big") return send("application/json", [big.slice(0, 500), new TextEncoder().encode(big.slice(500))]);
  if (url.pathname === "/api/small") return send("application/json", ['{"ok":true}'], 409);
  if (url.pathname === "/api/file") return send("application/pdf", [new Uint8Array(4096).fill(7)]);
  if (url.pathname === "/api/empty") {
    res.statusCode = 204;
    return res.end();
  }
  return send("text/html", [`<p>${big}</p>`]);
}

let server: Server;
let port: number;
beforeAll(async () => {
  server = createServer((req, res) => {
    encodeApiAnswers(req, res);
    nextLike(req, res);
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  port = (server.address() as AddressInfo).port;
});
afterAll(() => new Promise<void>((r) => server.close(() => r())));

function get(path: string, acceptEncoding?: string): Promise<{ status: number; headers: IncomingMessage["headers"]; body: Buffer }> {
  return new Promise((resolve, reject) => {
    const req = request({ host: "127.0.0.1", port, path, headers: acceptEncoding ? { "accept-encoding": acceptEncoding } : {} }, (res) => {
      const chunks: Buffer[] = [];
      res.on("data", (c) => chunks.push(c));
      res.on("end", () => resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }));
    });
    req.on("error", reject);
    req.end();
  });
}

describe("API answer encoding", () => {
  it("gzips a large JSON answer whole, with its length, and Next never sees Accept-Encoding", async () => {
    const res = await get("/api/big", "gzip, deflate, br");
    expect(seenEncoding).toBeUndefined();
    expect(res.headers["content-encoding"]).toBe("gzip");
    expect(res.headers["content-length"]).toBe(String(res.body.length));
    expect(res.headers.vary).toBe("rsc, Accept-Encoding");
    expect(gunzipSync(res.body).toString("utf8")).toBe(big);
  });

  it("sends a small JSON answer, or one to a client without gzip, as it is, with its length", async () => {
    const small = await get("/api/small", "gzip");
    expect(small.status).toBe(409);
    expect(small.headers["content-encoding"]).toBeUndefined();
    expect(small.body.toString()).toBe('{"ok":true}');
    expect(small.headers["content-length"]).toBe("11");
    const plain = await get("/api/big", "identity");
    expect(plain.headers["content-encoding"]).toBeUndefined();
    expect(plain.body.toString()).toBe(big);
    expect(big.length).toBeGreaterThan(COMPRESS_FROM_BYTES);
  });

  it("streams other API answers untouched, answers 204 without a body, and leaves pages to Next", async () => {
    const file = await get("/api/file", "gzip");
    expect(file.headers["content-encoding"]).toBeUndefined();
    expect(file.headers["transfer-encoding"]).toBe("chunked");
    expect(file.body).toEqual(Buffer.alloc(4096, 7));
    const empty = await get("/api/empty", "gzip");
    expect(empty.status).toBe(204);
    expect(empty.headers["content-length"]).toBeUndefined();
    await get("/patient", "gzip");
    expect(seenEncoding).toBe("gzip");
  });

  // [P] RFC 9110 §12.5.3: q=0 means "not acceptable"; "*" matches codings not listed.
  it.each([
    ["gzip, deflate, br", true],
    ["gzip;q=0", false],
    ["*", true],
    ["*;q=0", false],
    ["gzip;q=0, *", false],
    ["*;q=0, gzip", true],
    ["identity", false],
    ["br", false],
    ["X-GZIP", true],
    [undefined, false],
  ])("Accept-Encoding %s → gzip %s", (header, expected) => {
    expect(acceptsGzip(header)).toBe(expected);
  });
});
