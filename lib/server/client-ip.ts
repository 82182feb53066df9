// The client's IP address, for sign-in throttling and audit events. The app is served by
// scripts/server.mjs, which appends the socket's address to X-Forwarded-For as the last hop.
// Walking from the right, hops added by the proxies listed in TRUSTED_PROXIES (IPs or CIDRs,
// comma-separated; empty by default) are skipped; the first untrusted hop is the client. With
// no trusted proxies that is the socket address, whatever the client wrote into the header.
import { BlockList, isIP } from "node:net";

type HeaderSource = Headers | Record<string, string | string[] | undefined> | undefined | null;

let cached: { raw: string; list: BlockList } | undefined;

/** Parses a TRUSTED_PROXIES value; throws on an entry that is not an IP or a CIDR range. */
export function trustedProxies(raw = process.env.TRUSTED_PROXIES ?? ""): BlockList {
  if (cached?.raw === raw) return cached.list;
  const list = new BlockList();
  for (const entry of raw.split(",").map((s) => s.trim()).filter(Boolean)) {
    const [address, bits] = entry.split("/");
    const family = isIP(address);
    if (!family) throw new Error(`TRUSTED_PROXIES: "${entry}" is not an IP address or CIDR range.`);
    const type = family === 6 ? "ipv6" : "ipv4";
    if (bits === undefined) list.addAddress(address, type);
    else {
      const prefix = Number(bits);
      if (!Number.isInteger(prefix) || prefix < 0 || prefix > (family === 6 ? 128 : 32)) throw new Error(`TRUSTED_PROXIES: "${entry}" has a bad prefix length.`);
      list.addSubnet(address, prefix, type);
    }
  }
  cached = { raw, list };
  return list;
}

/** "::ffff:192.0.2.1" → "192.0.2.1"; "[2001:db8::1]:443" and "192.0.2.1:80" lose the port. */
export function normaliseAddress(value: string): string {
  let v = value.trim();
  const bracket = /^\[([^\]]+)\](?::\d+)?$/.exec(v);
  if (bracket) v = bracket[1];
  else if (/^\d{1,3}(\.\d{1,3}){3}:\d+$/.test(v)) v = v.slice(0, v.lastIndexOf(":"));
  const mapped = /^::ffff:(\d{1,3}(\.\d{1,3}){3})$/i.exec(v);
  if (mapped) v = mapped[1];
  return v.toLowerCase();
}

function isTrusted(list: BlockList, address: string): boolean {
  const family = isIP(address);
  return family !== 0 && list.check(address, family === 6 ? "ipv6" : "ipv4");
}

function headerValue(headers: HeaderSource, name: string): string | undefined {
  if (!headers) return undefined;
  if (typeof (headers as Headers).get === "function") return (headers as Headers).get(name) ?? undefined;
  const raw = (headers as Record<string, string | string[] | undefined>)[name];
  return Array.isArray(raw) ? raw.join(", ") : raw;
}

/** The nearest untrusted hop of X-Forwarded-For, walking from the right; "unknown" when there is none. */
export function clientIpFrom(headers: HeaderSource, trusted: BlockList = trustedProxies()): string {
  const hops = (headerValue(headers, "x-forwarded-for") ?? "").split(",").map(normaliseAddress).filter(Boolean);
  for (let i = hops.length - 1; i >= 0; i--) {
    if (!isTrusted(trusted, hops[i])) return isIP(hops[i]) ? hops[i] : "unknown";
  }
  // Every hop is a trusted proxy: the left-most one is as near to the client as we can see.
  return hops[0] ?? "unknown";
}
