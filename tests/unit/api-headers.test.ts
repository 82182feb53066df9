// API answers get their cache and transport headers from next.config.mjs, not from the proxy (which
// runs for pages only). The values must be the ones the proxy gives pages.
import { describe, expect, it } from "vitest";
// @ts-expect-error next.config.mjs is plain JavaScript, without type declarations
import nextConfig from "../../next.config.mjs";
import { isHttps, STRICT_TRANSPORT_SECURITY } from "@/lib/server/security-headers";

type Rule = { source: string; has?: { type: string; key: string; value?: string }[]; headers: { key: string; value: string }[] };

async function apiRules(): Promise<Rule[]> {
  const rules = (await (nextConfig as { headers: () => Promise<Rule[]> }).headers());
  return rules.filter((r) => r.source === "/api/:path*");
}

describe("API answer headers", () => {
  it("never lets an API answer be cached", async () => {
    const always = (await apiRules()).filter((r) => !r.has);
    expect(always.flatMap((r) => r.headers)).toContainEqual({ key: "Cache-Control", value: "no-store" });
  });

  it("sends the pages' HSTS value exactly when the proxy would, by X-Forwarded-Proto", async () => {
    const rule = (await apiRules()).find((r) => r.has?.some((h) => h.key === "x-forwarded-proto"))!;
    expect(rule.headers).toEqual([{ key: "Strict-Transport-Security", value: STRICT_TRANSPORT_SECURITY }]);
    // Next matches a `has` value as a regular expression over the whole header value.
    const pattern = new RegExp(`^${rule.has![0].value}$`);
    const http = new URL("http://clinic.example/api/x");
    for (const proto of ["https", "HTTPS", "https, http", "https,http", "http", "http, https", "ftp", ""]) {
      expect(pattern.test(proto), proto).toBe(isHttps(http, proto));
    }
  });
});
