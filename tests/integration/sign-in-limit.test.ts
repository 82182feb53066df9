// Sign-in throttling: counters in PostgreSQL, one atomic upsert per key and window, growing
// delays instead of a lock, a ceiling per IP, the sign-in link throttle, and audit events.
import { randomUUID } from "node:crypto";
import { Op } from "sequelize";
import { describe, expect, it } from "vitest";
import { AuditEvent, User } from "@/db/models";
import { authOptionsFor } from "@/lib/auth/options";
import { DUMMY_HASH, hashPassword, verifyPassword } from "@/lib/auth/password";
import {
  FREE_PER_ACCOUNT, FREE_PER_ACCOUNT_IP, MAX_DELAY_ACCOUNT, MAX_DELAY_ACCOUNT_IP, MAX_LINKS_PER_EMAIL, MAX_LINKS_PER_IP, MAX_PER_IP,
  signInSucceeded, takeSignInAttempt, takeSignInLink,
} from "@/lib/auth/rate-limit";
import { SIGN_IN_FAILED, SIGN_IN_LOCKED } from "@/lib/auth/schemas";
import { createTestClinic, createTestPatient } from "../support/fixtures";

const ip = () => `198.51.100.${Math.floor(Math.random() * 250)}`;
const email = () => `limit-${randomUUID()}@cuspal.test`;
// The counters use fixed windows; tests start at the beginning of a far-off window so a window
// boundary never falls inside one test, and so they do not meet each other's rows.
const windowAt = (n: number) => new Date(Date.UTC(2031, 0, 1) + n * 24 * 3600_000);
const later = (t: Date, seconds: number) => new Date(t.getTime() + seconds * 1000);
let windowNo = Math.floor(Math.random() * 100_000);
const freshWindow = () => windowAt(windowNo++);

function credentialsAuthorize() {
  const provider = authOptionsFor().providers.find((p) => p.id === "credentials") as unknown as {
    options: { authorize: (c: Record<string, string>, req: { headers: Record<string, string> }) => Promise<unknown> };
  };
  return provider.options.authorize;
}

describe("sign-in throttling", () => {
  it("parallel attempts for one account from one IP: only the free attempts go ahead", async () => {
    const [who, from, t] = [email(), ip(), freshWindow()];
    const results = await Promise.all(Array.from({ length: 25 }, () => takeSignInAttempt(who, from, t)));
    expect(results.filter((r) => r.allowed)).toHaveLength(FREE_PER_ACCOUNT_IP);
  });

  it("delays grow (2, 4, 8 … seconds) and are capped, so nobody is locked out for good", async () => {
    const [who, from, t0] = [email(), ip(), freshWindow()];
    for (let i = 0; i < FREE_PER_ACCOUNT_IP; i++) expect((await takeSignInAttempt(who, from, t0)).allowed).toBe(true);
    const refused = await takeSignInAttempt(who, from, later(t0, 1));
    expect(refused).toMatchObject({ allowed: false, limit: "account-ip", retryAfterSeconds: 1 });
    expect((await takeSignInAttempt(who, from, later(t0, 2))).allowed).toBe(true); // waited 2 s
    expect((await takeSignInAttempt(who, from, later(t0, 5))).allowed).toBe(false); // needs 2 + 4
    expect((await takeSignInAttempt(who, from, later(t0, 6))).allowed).toBe(true);
    let t = later(t0, 6);
    let last = 4;
    for (let i = 0; i < 12; i++) {
      const next = Math.min(last * 2, MAX_DELAY_ACCOUNT_IP);
      expect((await takeSignInAttempt(who, from, later(t, next - 1))).allowed).toBe(false);
      t = later(t, next);
      expect((await takeSignInAttempt(who, from, t)).allowed).toBe(true);
      last = next;
    }
    expect(last).toBe(MAX_DELAY_ACCOUNT_IP);
  });

  it("a stranger's guesses from elsewhere do not hold up the owner's IP until the account-wide threshold, then only briefly", async () => {
    const [who, owner, t] = [email(), "192.0.2.10", freshWindow()];
    for (let i = 0; i < FREE_PER_ACCOUNT - 1; i++) await takeSignInAttempt(who, `203.0.113.${i}`, t);
    expect((await takeSignInAttempt(who, owner, t)).allowed).toBe(true);
    const held = await takeSignInAttempt(who, owner, later(t, 1));
    expect(held).toMatchObject({ allowed: false, limit: "account" });
    expect(held.allowed ? 0 : held.retryAfterSeconds).toBeLessThanOrEqual(MAX_DELAY_ACCOUNT);
    expect((await takeSignInAttempt(who, owner, later(t, MAX_DELAY_ACCOUNT))).allowed).toBe(true);
  });

  it("one IP trying many accounts hits its ceiling for the rest of the window", async () => {
    const [from, t] = [`${ip()}`, freshWindow()];
    const results = await Promise.all(Array.from({ length: MAX_PER_IP + 5 }, () => takeSignInAttempt(email(), from, t)));
    expect(results.filter((r) => r.allowed)).toHaveLength(MAX_PER_IP);
    expect(await takeSignInAttempt(email(), from, later(t, 60))).toMatchObject({ allowed: false, limit: "ip" });
  });

  it("a success starts the account afresh and gives the IP its attempt back", async () => {
    const [who, from, t] = [email(), ip(), freshWindow()];
    for (let i = 0; i < FREE_PER_ACCOUNT_IP; i++) await takeSignInAttempt(who, from, t);
    expect((await takeSignInAttempt(who, from, t)).allowed).toBe(false);
    await signInSucceeded(who, from, t);
    expect((await takeSignInAttempt(who, from, t)).allowed).toBe(true);
  });

  it("sign-in links: a few per address and per IP", async () => {
    const [who, from, t] = [email(), ip(), freshWindow()];
    const perAddress = await Promise.all(Array.from({ length: MAX_LINKS_PER_EMAIL + 3 }, (_, i) => takeSignInLink(who, `${from}${i}`, t)));
    expect(perAddress.filter((r) => r.allowed)).toHaveLength(MAX_LINKS_PER_EMAIL);
    const perIp = await Promise.all(Array.from({ length: MAX_LINKS_PER_IP + 3 }, () => takeSignInLink(email(), from, t)));
    expect(perIp.filter((r) => r.allowed)).toHaveLength(MAX_LINKS_PER_IP);
  });
});

describe("credentials sign-in", () => {
  it("parallel wrong guesses through the sign-in itself: the limit holds, each attempt is audited by id", async () => {
    const t = await createTestClinic();
    const password = "right-password-1234";
    await User.update({ passwordHash: await hashPassword(password) }, { where: { id: t.staff.reception.id } });
    const authorize = credentialsAuthorize();
    const from = `192.0.2.${Math.floor(Math.random() * 250)}`;
    const req = { headers: { "x-forwarded-for": from, "user-agent": "vitest" } };
    const outcomes = await Promise.allSettled(
      Array.from({ length: 15 }, (_, i) => authorize({ email: t.staff.reception.email, password: `wrong-${i}` }, req)),
    );
    const messages = outcomes.map((o) => (o.status === "rejected" ? (o.reason as Error).message : "signed in"));
    expect(messages.filter((m) => m === SIGN_IN_FAILED)).toHaveLength(FREE_PER_ACCOUNT_IP);
    expect(messages.filter((m) => m === SIGN_IN_LOCKED)).toHaveLength(15 - FREE_PER_ACCOUNT_IP);
    // Even the right password waits its turn now.
    await expect(authorize({ email: t.staff.reception.email, password }, req)).rejects.toThrow(SIGN_IN_LOCKED);

    const events = await AuditEvent.findAll({ where: { subjectId: t.staff.reception.id, action: { [Op.like]: "auth.%" } } });
    expect(events.filter((e) => e.action === "auth.sign_in_failed")).toHaveLength(FREE_PER_ACCOUNT_IP);
    expect(events.filter((e) => e.action === "auth.sign_in_throttled")).toHaveLength(16 - FREE_PER_ACCOUNT_IP);
    for (const e of events) {
      expect(e.ip).toBe(from);
      expect(JSON.stringify(e.data)).not.toMatch(/wrong-|right-password|@/);
    }

    // From another address the owner gets in, and the success is audited.
    const user = await authorize({ email: t.staff.reception.email, password }, { headers: { "x-forwarded-for": "192.0.2.251" } });
    expect(user).toMatchObject({ id: t.staff.reception.id, role: "reception" });
    expect(await AuditEvent.count({ where: { subjectId: t.staff.reception.id, action: "auth.sign_in" } })).toBe(1);
  });
});

describe("sign-in link requests", () => {
  it("answer with the same neutral page once an address has asked too often", async () => {
    const t = await createTestClinic();
    const { user } = await createTestPatient(t.clinic.id);
    const signInCallback = authOptionsFor(`192.0.2.${Math.floor(Math.random() * 250)}`).callbacks!.signIn!;
    const ask = () => signInCallback({ user: { id: user.id, email: user.email }, account: { provider: "email", type: "email", providerAccountId: user.email }, email: { verificationRequest: true } } as never);
    const answers = [];
    for (let i = 0; i < MAX_LINKS_PER_EMAIL + 2; i++) answers.push(await ask());
    expect(answers).toEqual([...Array(MAX_LINKS_PER_EMAIL).fill(true), "/sign-in/check-mail", "/sign-in/check-mail"]);
    expect(await AuditEvent.count({ where: { subjectId: user.id, action: "auth.sign_in_link_throttled" } })).toBe(2);
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
