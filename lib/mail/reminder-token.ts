// The token in a reminder e-mail's "turn off reminders" link: the visit id and an HMAC-SHA256 over
// it, keyed from NEXTAUTH_SECRET. It proves the link came from us without a session or a table.
import { createHmac, timingSafeEqual } from "node:crypto";

const PURPOSE = "cuspal/reminder-link/v1";
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

function key(secret = process.env.NEXTAUTH_SECRET): Buffer {
  if (!secret || secret.length < 16) throw new Error("NEXTAUTH_SECRET must be set (at least 16 characters) to sign reminder links.");
  // A key of its own, so a reminder token can never be mistaken for any other signed value.
  return createHmac("sha256", secret).update(PURPOSE).digest();
}

function sign(appointmentId: string, secret?: string): string {
  return createHmac("sha256", key(secret)).update(appointmentId).digest("base64url");
}

export function reminderToken(appointmentId: string, secret?: string): string {
  return `${appointmentId}.${sign(appointmentId, secret)}`;
}

/** The visit id when the token is genuine, otherwise null. */
export function verifyReminderToken(token: string, secret?: string): string | null {
  const [id, mac, extra] = String(token).split(".");
  if (extra !== undefined || !id || !mac || !UUID.test(id)) return null;
  const expected = Buffer.from(sign(id, secret));
  const given = Buffer.from(mac);
  return given.length === expected.length && timingSafeEqual(given, expected) ? id : null;
}

export function reminderLink(appointmentId: string): string {
  const base = (process.env.APP_URL ?? "http://localhost:3000").replace(/\/$/, "");
  return `${base}/reminders/${reminderToken(appointmentId)}`;
}

export function reminderOneClickUrl(appointmentId: string): string {
  const base = (process.env.APP_URL ?? "http://localhost:3000").replace(/\/$/, "");
  return `${base}/api/reminders/${reminderToken(appointmentId)}`;
}
