// One-time codes (RFC 6238) and the protection of their secrets at rest.
import { generate } from "otplib";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { checkTotp, hashRecoveryCode, looksLikeRecoveryCode, newRecoveryCodes, newTotpSecret, openSecret, sealSecret, totpUri } from "@/lib/auth/totp";

describe("RFC 6238 test vectors through otplib", () => {
  // [P] RFC 6238, Appendix B (test vectors): SHA-1, the ASCII seed "12345678901234567890",
  // 30-second steps from T0 = 0, 8 digits.
  const seed = new TextEncoder().encode("12345678901234567890");
  const vectors: [number, string][] = [
    [59, "94287082"],
    [1111111109, "07081804"],
    [1111111111, "14050471"],
  ];
  for (const [epoch, code] of vectors) {
    it(`T = ${epoch} s gives ${code}`, async () => {
      expect(await generate({ secret: seed, algorithm: "sha1", digits: 8, period: 30, epoch })).toBe(code);
    });
  }
});

describe("checking codes", () => {
  it("accepts the current code and one step either side, refuses older ones and replays", async () => {
    const secret = newTotpSecret();
    const now = new Date(Date.UTC(2030, 5, 1, 12, 0, 10));
    const at = async (offsetSeconds: number) => generate({ secret, epoch: Math.floor(now.getTime() / 1000) + offsetSeconds });
    const step = Math.floor(now.getTime() / 1000 / 30);
    expect(await checkTotp(secret, await at(0), { now })).toBe(step);
    expect(await checkTotp(secret, await at(-30), { now })).toBe(step - 1);
    expect(await checkTotp(secret, await at(30), { now })).toBe(step + 1);
    expect(await checkTotp(secret, await at(-90), { now })).toBeNull();
    // The step already used cannot be used again.
    expect(await checkTotp(secret, await at(0), { now, afterStep: step })).toBeNull();
    expect(await checkTotp(secret, "12345", { now })).toBeNull();
  });

  it("makes an otpauth URI an authenticator app can read", () => {
    const uri = totpUri("JBSWY3DPEHPK3PXP", "dentist@cuspal.test");
    // [C] the otpauth:// key URI format authenticator apps read (no RFC; common practice).
    expect(uri).toMatch(/^otpauth:\/\/totp\/Cuspal:dentist(%40|@)cuspal\.test\?/);
    expect(new URL(uri).searchParams.get("secret")).toBe("JBSWY3DPEHPK3PXP");
    expect(new URL(uri).searchParams.get("issuer")).toBe("Cuspal");
  });
});

describe("secrets at rest", () => {
  beforeAll(() => vi.stubEnv("NEXTAUTH_SECRET", "unit-test-secret-0123456789"));
  afterAll(() => vi.unstubAllEnvs());
  it("are encrypted: the stored form does not contain the secret, opens back, and refuses tampering", () => {
    const secret = newTotpSecret();
    const sealed = sealSecret(secret);
    expect(sealed).not.toContain(secret);
    expect(sealSecret(secret)).not.toBe(sealed); // a fresh IV each time
    expect(openSecret(sealed)).toBe(secret);
    const [v, iv, tag, body] = sealed.split(".");
    const flipped = Buffer.from(body, "base64url");
    flipped[0] ^= 1;
    expect(() => openSecret([v, iv, tag, flipped.toString("base64url")].join("."))).toThrow();
  });

  it("need NEXTAUTH_SECRET: another key cannot open them", () => {
    const sealed = sealSecret("JBSWY3DPEHPK3PXP");
    vi.stubEnv("NEXTAUTH_SECRET", "a-different-secret-of-enough-length");
    expect(() => openSecret(sealed)).toThrow();
    vi.stubEnv("NEXTAUTH_SECRET", "unit-test-secret-0123456789");
    expect(openSecret(sealed)).toBe("JBSWY3DPEHPK3PXP");
  });
});

describe("recovery codes", () => {
  it("ten distinct codes, recognised as recovery codes, hashed the same however they are typed", () => {
    const codes = newRecoveryCodes();
    expect(codes).toHaveLength(10);
    expect(new Set(codes).size).toBe(10);
    for (const c of codes) {
      expect(c).toMatch(/^[a-z2-9]{5}-[a-z2-9]{5}$/);
      expect(looksLikeRecoveryCode(c)).toBe(true);
      expect(hashRecoveryCode(c.toUpperCase().replace("-", " "))).toBe(hashRecoveryCode(c));
    }
    expect(looksLikeRecoveryCode("123456")).toBe(false);
    expect(hashRecoveryCode("abcde-fghjk")).toMatch(/^[0-9a-f]{64}$/);
  });
});
