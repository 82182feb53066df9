// The token in a reminder e-mail's "turn off reminders" link: the visit id, when the link expires,
// and an HMAC-SHA256 over both, keyed from NEXTAUTH_SECRET. It proves the link came from us
// without a session or a table. A link expires 30 days after the visit it was sent for; since the
// expiry is derived from the visit's start, moving the visit replaces the link (the old one no
// longer matches the visit, see `linkMatchesVisit`).
import { createHmac, timingSafeEqual } from "node:crypto";

const PURPOSE = "cuspal/reminder-link/v2";
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;
export const REMINDER_LINK_DAYS = 30;

function key(secret = process.env.NEXTAUTH_SECRET): Buffer {
  if (!secret || secret.length < 16) throw new Error("NEXTAUTH_SECRET must be set (at least 16 characters) to sign reminder links.");
  // A key of its own, so a reminder token can never be mistaken for any other signed value.
  return createHmac("sha256", secret).update(PURPOSE).digest();
}

function sign(payload: string, secret?: string): string {
  return createHmac("sha256", key(secret)).update(payload).digest("base64url");
}

/** When a link for a visit starting at `startsAt` stops working, in whole seconds since 1970. */
export function reminderLinkExpiry(startsAt: Date): number {
  return Math.floor(startsAt.getTime() / 1000) + REMINDER_LINK_DAYS * 24 * 3600;
}

export function reminderToken(appointmentId: string, startsAt: Date, secret?: string): string {
  const payload = `${appointmentId}.${reminderLinkExpiry(startsAt)}`;
  return `${payload}.${sign(payload, secret)}`;
}

/** The visit id and expiry when the token is genuine and not expired, otherwise null. */
export function verifyReminderToken(token: string, { secret, now = new Date() }: { secret?: string; now?: Date } = {}) {
  const [id, exp, mac, extra] = String(token).split(".");
  if (extra !== undefined || !id || !exp || !mac || !UUID.test(id) || !/^\d{1,12}$/.test(exp)) return null;
  const expected = Buffer.from(sign(`${id}.${exp}`, secret));
  const given = Buffer.from(mac);
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) return null;
  const expiresAt = Number(exp);
  if (now.getTime() >= expiresAt * 1000) return null;
  return { id, expiresAt };
}

/** A genuine token is only good for the visit's current time: a moved visit's old links stop working. */
export function linkMatchesVisit(verified: { expiresAt: number }, visit: { startsAt: Date }): boolean {
  return verified.expiresAt === reminderLinkExpiry(visit.startsAt);
}

export function reminderLink(appointmentId: string, startsAt: Date): string {
  const base = (process.env.APP_URL ?? "http://localhost:3000").replace(/\/$/, "");
  return `${base}/reminders/${reminderToken(appointmentId, startsAt)}`;
}

export function reminderOneClickUrl(appointmentId: string, startsAt: Date): string {
  const base = (process.env.APP_URL ?? "http://localhost:3000").replace(/\/$/, "");
  return `${base}/api/reminders/${reminderToken(appointmentId, startsAt)}`;
}
