// Our session-token reader against next-auth 4's own encode/decode (the reference: it writes the
// cookies this reads) and @panva/hkdf (next-auth's own key derivation).
import hkdf from "@panva/hkdf";
import { decode, encode } from "next-auth/jwt";
import { describe, expect, it } from "vitest";
import { decodeSessionToken, sessionKey } from "@/lib/auth/session-token";

const secret = "test-secret-0123456789abcdef-0123456789";
const claims = { sub: "6d0c1a2b-0000-4000-8000-000000000001", email: "amélie@example.test", name: "Amélie", role: "patient" as const, sv: 3, authAt: 1_790_000_000 };

describe("session token", () => {
  it("derives the key next-auth derives", async () => {
    const reference = await hkdf("sha256", secret, "", "NextAuth.js Generated Encryption Key", 32);
    expect(Buffer.from(sessionKey(secret)).toString("hex")).toBe(Buffer.from(reference).toString("hex"));
    const salted = await hkdf("sha256", secret, "s", "NextAuth.js Generated Encryption Key (s)", 32);
    expect(Buffer.from(sessionKey(secret, "s")).toString("hex")).toBe(Buffer.from(salted).toString("hex"));
  });

  it("reads what next-auth writes, as next-auth reads it", async () => {
    const token = await encode({ token: claims, secret });
    const ours = await decodeSessionToken({ token, secret });
    expect(ours).toEqual(await decode({ token, secret }));
    expect(ours).toMatchObject(claims);
  });

  it("refuses a token altered, sealed with another secret, expired, or missing", async () => {
    const token = await encode({ token: claims, secret });
    // Flip one character of the ciphertext (4th of 5 dot-separated parts).
    const parts = token.split(".");
    parts[3] = (parts[3][0] === "A" ? "B" : "A") + parts[3].slice(1);
    await expect(decodeSessionToken({ token: parts.join("."), secret })).rejects.toThrow();
    await expect(decodeSessionToken({ token, secret: `${secret}-other` })).rejects.toThrow();
    const expired = await encode({ token: claims, secret, maxAge: -60 });
    await expect(decode({ token: expired, secret })).rejects.toThrow();
    await expect(decodeSessionToken({ token: expired, secret })).rejects.toThrow();
    expect(await decodeSessionToken({ token: undefined, secret })).toBeNull();
  });
});
