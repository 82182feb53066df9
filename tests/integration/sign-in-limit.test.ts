// The sign-in limit counts failures in PostgreSQL per e-mail and per IP.
import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { clearFailures, MAX_PER_EMAIL, MAX_PER_IP, recordFailure, tooManyFailures, WINDOW_MINUTES } from "@/lib/auth/rate-limit";
import { DUMMY_HASH, hashPassword, verifyPassword } from "@/lib/auth/password";

describe("sign-in rate limit", () => {
  it("locks an e-mail after the allowed number of failures, from any IP", async () => {
    const email = `limit-${randomUUID()}@cuspal.test`;
    for (let i = 0; i < MAX_PER_EMAIL - 1; i++) await recordFailure(email, `10.0.0.${i}`);
    expect(await tooManyFailures(email, "192.0.2.1")).toBe(false);
    await recordFailure(email, "192.0.2.1");
    expect(await tooManyFailures(email, "192.0.2.99")).toBe(true);
  });

  it("forgets failures older than the window and after a success", async () => {
    const email = `window-${randomUUID()}@cuspal.test`;
    for (let i = 0; i < MAX_PER_EMAIL; i++) await recordFailure(email, "192.0.2.2");
    const later = new Date(Date.now() + (WINDOW_MINUTES + 1) * 60_000);
    expect(await tooManyFailures(email, "192.0.2.3", later)).toBe(false);
    expect(await tooManyFailures(email, "192.0.2.3")).toBe(true);
    await clearFailures(email);
    expect(await tooManyFailures(email, "192.0.2.3")).toBe(false);
  });

  it("locks one IP that tries many different e-mails", async () => {
    const ip = `198.51.100.${Math.floor(Math.random() * 250)}-${randomUUID().slice(0, 8)}`;
    for (let i = 0; i < MAX_PER_IP; i++) await recordFailure(`spray-${i}-${randomUUID()}@cuspal.test`, ip);
    expect(await tooManyFailures(`fresh-${randomUUID()}@cuspal.test`, ip)).toBe(true);
  });
});

describe("password hashing", () => {
  it("verifies the right password only, and the dummy hash is a valid bcrypt hash", async () => {
    const hash = await hashPassword("correct horse");
    expect(hash).toMatch(/^\$2[aby]\$10\$/);
    expect(await verifyPassword("correct horse", hash)).toBe(true);
    expect(await verifyPassword("correct hose", hash)).toBe(false);
    expect(await verifyPassword("anything", DUMMY_HASH)).toBe(false);
  });
});
