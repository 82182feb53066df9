// The list cursor: what it writes it reads back exactly (microseconds included), and anything
// else, including a well-formed string naming an impossible time, is not a position.
import { describe, expect, it } from "vitest";
import { decodeCursor, encodeCursor } from "@/lib/domain/list-cursor";

const ID = "0b6f3c1e-2a4d-4e5f-8a9b-1c2d3e4f5a6b";

describe("list cursor", () => {
  it("reads back the position it wrote, to the microsecond", () => {
    const position = { at: "2026-03-02T15:00:00.000500Z", id: ID };
    const cursor = encodeCursor(position);
    expect(cursor).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(decodeCursor(cursor)).toEqual(position);
    expect(decodeCursor(encodeCursor({ at: "2026-03-02T15:00:00.000501Z", id: ID }))).not.toEqual(position);
  });

  it("refuses what it did not write", () => {
    const raw = (s: string) => Buffer.from(s, "utf8").toString("base64url");
    for (const bad of [
      "",
      "not a cursor",
      raw("2026-03-02T15:00:00.000500Z"),
      raw(`2026-03-02T15:00:00.000Z|${ID}`), // milliseconds only
      raw(`2026-13-02T15:00:00.000000Z|${ID}`), // month 13
      raw(`2026-02-30T15:00:00.000000Z|${ID}`), // 30 February
      raw(`2026-03-02T25:00:00.000000Z|${ID}`),
      raw(`2026-03-02T15:00:00.000000Z|${ID.toUpperCase()}`),
      raw(`2026-03-02T15:00:00.000000Z|${ID}|extra`),
      raw(`2026-03-02T15:00:00.000000Z|'; DROP TABLE consents; --`),
      "A".repeat(201),
    ]) {
      expect(decodeCursor(bad), bad).toBeNull();
    }
  });
});
