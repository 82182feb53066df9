// The position after the last row of a page, for lists read newest first by (time, id). It is
// written as base64url so callers treat it as an opaque token; the time keeps PostgreSQL's
// microseconds (a JavaScript Date keeps only milliseconds, which would skip or repeat rows that
// share a millisecond).

export type ListPosition = { at: string; id: string };

const AT = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{6}Z$/;
const ID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

export function encodeCursor(position: ListPosition): string {
  return Buffer.from(`${position.at}|${position.id}`, "utf8").toString("base64url");
}

/** The position a cursor names, or null when it is not one this module wrote. */
export function decodeCursor(cursor: string): ListPosition | null {
  if (!/^[A-Za-z0-9_-]{1,200}$/.test(cursor)) return null;
  const [at, id, ...rest] = Buffer.from(cursor, "base64url").toString("utf8").split("|");
  if (rest.length || !at || !id || !AT.test(at) || !ID.test(id)) return null;
  // A well-formed but impossible time (month 13, 25 o'clock) is not a position either.
  const ms = Date.parse(at);
  if (Number.isNaN(ms) || new Date(ms).toISOString().slice(0, 19) !== at.slice(0, 19)) return null;
  return { at, id };
}
