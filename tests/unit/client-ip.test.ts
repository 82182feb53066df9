// The client's IP from X-Forwarded-For, as written by scripts/server.mjs (socket address last).
import { describe, expect, it } from "vitest";
import { clientIpFrom, normaliseAddress, trustedProxies } from "@/lib/server/client-ip";

const h = (xff: string) => new Headers({ "x-forwarded-for": xff });

describe("client IP", () => {
  it("without trusted proxies, the socket address wins over anything the client wrote", () => {
    const none = trustedProxies("");
    expect(clientIpFrom(h("6.6.6.6, 198.51.100.7"), none)).toBe("198.51.100.7");
    expect(clientIpFrom(h("::ffff:198.51.100.7"), none)).toBe("198.51.100.7");
  });

  it("behind listed proxies, the nearest untrusted hop counts (walking from the right)", () => {
    const list = trustedProxies("10.0.0.0/8, 192.0.2.5, 2001:db8::/32");
    // client-written spoof, the real client, then two of our proxies (the last is the socket)
    expect(clientIpFrom(h("6.6.6.6, 203.0.113.9, 10.1.2.3, 192.0.2.5"), list)).toBe("203.0.113.9");
    expect(clientIpFrom(h("203.0.113.9, 2001:db8::1"), list)).toBe("203.0.113.9");
    // a proxy that is not listed is itself the client as far as we can tell
    expect(clientIpFrom(h("203.0.113.9, 192.0.2.6"), list)).toBe("192.0.2.6");
    // all hops trusted: the left-most
    expect(clientIpFrom(h("10.0.0.1, 10.0.0.2"), list)).toBe("10.0.0.1");
  });

  it("junk is 'unknown', plain objects of headers work too (as next-auth passes them)", () => {
    const none = trustedProxies("");
    expect(clientIpFrom(h("not-an-ip"), none)).toBe("unknown");
    expect(clientIpFrom(undefined, none)).toBe("unknown");
    expect(clientIpFrom({ "x-forwarded-for": "1.2.3.4, 198.51.100.8" }, none)).toBe("198.51.100.8");
  });

  it("normalises mapped IPv4 and ports, and refuses a bad setting", () => {
    expect(normaliseAddress("[2001:DB8::1]:443")).toBe("2001:db8::1");
    expect(normaliseAddress("192.0.2.1:8080")).toBe("192.0.2.1");
    expect(() => trustedProxies("10.0.0.0/33")).toThrow(/prefix/);
    expect(() => trustedProxies("proxy.example")).toThrow(/not an IP/);
  });
});
