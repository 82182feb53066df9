// Which requests the server answers without Next's gzip stream: API writes only.
import { describe, expect, it } from "vitest";
// @ts-expect-error scripts/*.mjs are plain JavaScript, without type declarations
import { isApiWrite, plainAnswerForApiWrites } from "../../scripts/api-write-encoding.mjs";

describe("API write answers", () => {
  it.each([
    ["POST", "/api/appointments", true],
    ["patch", "/api/staff/1", true],
    ["DELETE", "/api/documents/1?x=1", true],
    ["PUT", "/api/me", true],
    ["GET", "/api/proposals/1/availability", false],
    ["HEAD", "/api/health", false],
    // A server action posts to a page: its answer is a page stream, compressed as before.
    ["POST", "/patient/proposals/1", false],
    ["POST", "/apiary", false],
  ])("%s %s → %s", (method, url, expected) => {
    expect(isApiWrite(method, url)).toBe(expected);
  });

  it("drops Accept-Encoding from an API write and leaves other requests alone", () => {
    const write = { method: "POST", url: "/api/appointments", headers: { "accept-encoding": "gzip, br", cookie: "c" } as Record<string, string> };
    plainAnswerForApiWrites(write);
    expect(write.headers).toEqual({ cookie: "c" });
    const read = { method: "GET", url: "/api/appointments", headers: { "accept-encoding": "gzip" } as Record<string, string> };
    plainAnswerForApiWrites(read);
    expect(read.headers["accept-encoding"]).toBe("gzip");
  });
});
