// Reading an Accept-Encoding header (RFC 9110 §12.5.3): each listed coding with its weight, q=1
// unless given; q=0 means "not acceptable".

/** Lower-cased coding → weight, as the client listed them. */
export function codingWeights(header) {
  const weights = new Map();
  for (const part of String(header ?? "").split(",")) {
    const [coding, ...params] = part.split(";").map((s) => s.trim().toLowerCase());
    if (!coding) continue;
    const q = params.find((p) => p.startsWith("q="));
    weights.set(coding, q === undefined ? 1 : Number(q.slice(2)) || 0);
  }
  return weights;
}
