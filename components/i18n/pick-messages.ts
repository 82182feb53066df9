// Kept apart from the provider: a page that only picks messages must not import the provider
// (Next ships every client component a page's modules import, rendered or not).

type Messages = Record<string, unknown>;

/** The messages under `namespaces` ("booking", or a part of one: "payments.planForm"), in the same shape. */
export function pickMessages(all: Messages, namespaces: readonly string[]): Messages {
  const picked: Messages = {};
  for (const ns of namespaces) {
    const keys = ns.split(".");
    let from: unknown = all;
    for (const k of keys) from = from && typeof from === "object" ? (from as Messages)[k] : undefined;
    if (from === undefined) continue;
    let into = picked;
    for (const k of keys.slice(0, -1)) into = (into[k] ??= {}) as Messages;
    into[keys[keys.length - 1]] = from;
  }
  return picked;
}
