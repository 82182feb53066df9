// Slows down password and code guessing, and sign-in link flooding. Counters live in PostgreSQL
// (every app instance sees the same counts), one row per key and fixed window. Each attempt is
// counted by ONE upsert that also decides whether it may go ahead, so parallel guesses cannot
// slip past the limit between a read and a write.
//
// Instead of a lock anyone could keep renewing, an account tried from one IP gets growing delays
// once its free attempts are used (2, 4, 8 … seconds, capped); the same account across all IPs
// gets delays only after many more failures and with a short cap, so a stranger can slow an
// account down but never shut its owner out for long. Each IP has a hard ceiling per window.
// Account delays are counted over a day, so waiting for the next window does not reset them.
import "server-only";
import { createHash } from "node:crypto";
import { QueryTypes } from "sequelize";
import { sequelize } from "@/db/sequelize";

/** Window of the per-IP ceilings; delays per account are counted over a day. */
export const WINDOW_MINUTES = 15;
export const ACCOUNT_WINDOW_MINUTES = 24 * 60;
/** Attempts for one account from one IP before delays start, and the longest delay (seconds). */
export const FREE_PER_ACCOUNT_IP = 5;
export const MAX_DELAY_ACCOUNT_IP = 15 * 60;
/** Attempts for one account from all IPs before delays start, and their cap (seconds). */
export const FREE_PER_ACCOUNT = 20;
export const MAX_DELAY_ACCOUNT = 60;
/** Failed attempts one IP may make per window, whatever the accounts. */
export const MAX_PER_IP = 50;
/** Sign-in link requests per e-mail address and per IP per window. */
export const MAX_LINKS_PER_EMAIL = 3;
export const MAX_LINKS_PER_IP = 10;

export type Throttle = { allowed: true } | { allowed: false; retryAfterSeconds: number; limit: string };

type Rule = { key: string; limit: string; windowMinutes: number; free?: number; cap?: number; hard?: number };

// E-mail addresses are hashed in the keys so the counters hold no personal data.
const tag = (email: string) => createHash("sha256").update(email.trim().toLowerCase()).digest("hex").slice(0, 32);
export const keys = {
  ip: (ip: string) => `ip:${ip}`,
  account: (email: string) => `acct:${tag(email)}`,
  accountIp: (email: string, ip: string) => `acct-ip:${tag(email)}:${ip}`,
  linkEmail: (email: string) => `link:${tag(email)}`,
  linkIp: (ip: string) => `link-ip:${ip}`,
};

function windowStart(now: Date, minutes: number): Date {
  const ms = minutes * 60_000;
  return new Date(Math.floor(now.getTime() / ms) * ms);
}

/** Counts one attempt against a rule, unless it must wait (then nothing is counted). */
async function take(rule: Rule, now: Date): Promise<Throttle> {
  const win = windowStart(now, rule.windowMinutes);
  const rows = await sequelize.query<{ count: number }>(
    `INSERT INTO sign_in_counters AS c (key, window_start, count, next_allowed_at)
     VALUES (:key, :win, 1, :win)
     ON CONFLICT (key, window_start) DO UPDATE SET
       count = c.count + 1,
       -- After the free attempts, the next one must wait 2, 4, 8 … seconds (capped).
       next_allowed_at = CASE
         WHEN CAST(:free AS integer) IS NOT NULL AND c.count + 1 >= CAST(:free AS integer)
         THEN CAST(:now AS timestamptz) + make_interval(secs => least(power(2, c.count + 2 - CAST(:free AS integer)), CAST(:cap AS integer)))
         ELSE c.next_allowed_at END
     WHERE c.next_allowed_at <= CAST(:now AS timestamptz)
       AND (CAST(:hard AS integer) IS NULL OR c.count < CAST(:hard AS integer))
     RETURNING count`,
    {
      replacements: { key: rule.key, win, now, free: rule.free ?? null, cap: rule.cap ?? null, hard: rule.hard ?? null },
      type: QueryTypes.SELECT,
    },
  );
  if (rows.length > 0) return { allowed: true };
  const [row] = await sequelize.query<{ wait: number; count: number }>(
    `SELECT greatest(0, extract(epoch FROM next_allowed_at - CAST(:now AS timestamptz)))::float AS wait, count
       FROM sign_in_counters WHERE key = :key AND window_start = :win`,
    { replacements: { key: rule.key, win, now }, type: QueryTypes.SELECT },
  );
  const untilWindowEnds = (win.getTime() + rule.windowMinutes * 60_000 - now.getTime()) / 1000;
  const wait = rule.hard !== undefined && row && row.count >= rule.hard ? untilWindowEnds : (row?.wait ?? 1);
  return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil(wait)), limit: rule.limit };
}

async function takeAll(rules: Rule[], now: Date): Promise<Throttle> {
  for (const rule of rules) {
    const result = await take(rule, now);
    if (!result.allowed) return result;
  }
  return { allowed: true };
}

/**
 * Counts a password (or code) attempt before it is checked. A refused attempt must not be checked
 * at all, so a correct guess during a delay reveals nothing.
 */
export function takeSignInAttempt(email: string, ip: string, now = new Date()): Promise<Throttle> {
  return takeAll(
    [
      { key: keys.ip(ip), limit: "ip", windowMinutes: WINDOW_MINUTES, hard: MAX_PER_IP },
      { key: keys.accountIp(email, ip), limit: "account-ip", windowMinutes: ACCOUNT_WINDOW_MINUTES, free: FREE_PER_ACCOUNT_IP, cap: MAX_DELAY_ACCOUNT_IP },
      { key: keys.account(email), limit: "account", windowMinutes: ACCOUNT_WINDOW_MINUTES, free: FREE_PER_ACCOUNT, cap: MAX_DELAY_ACCOUNT },
    ],
    now,
  );
}

/** After a successful sign-in: the account starts afresh, and the IP gets its attempt back. */
export async function signInSucceeded(email: string, ip: string, now = new Date()) {
  await sequelize.query(`DELETE FROM sign_in_counters WHERE key IN (:keys)`, {
    replacements: { keys: [keys.account(email), keys.accountIp(email, ip)] },
  });
  await sequelize.query(`UPDATE sign_in_counters SET count = greatest(count - 1, 0) WHERE key = :key AND window_start = :win`, {
    replacements: { key: keys.ip(ip), win: windowStart(now, WINDOW_MINUTES) },
  });
}

/** Counts a request for an e-mailed sign-in link, per address and per IP. */
export function takeSignInLink(email: string, ip: string, now = new Date()): Promise<Throttle> {
  return takeAll(
    [
      { key: keys.linkIp(ip), limit: "link-ip", windowMinutes: WINDOW_MINUTES, hard: MAX_LINKS_PER_IP },
      { key: keys.linkEmail(email), limit: "link-email", windowMinutes: WINDOW_MINUTES, hard: MAX_LINKS_PER_EMAIL },
    ],
    now,
  );
}

/** Drops counters of windows that ended (they no longer matter); called after some sign-ins. */
export async function pruneCounters(now = new Date()) {
  await sequelize.query(`DELETE FROM sign_in_counters WHERE window_start < :before`, {
    replacements: { before: new Date(now.getTime() - 2 * ACCOUNT_WINDOW_MINUTES * 60_000) },
  });
}
