// Slows down password guessing: failed sign-ins are counted in PostgreSQL (so every app
// instance sees the same counts) per e-mail and per IP over a sliding window.
import { Op } from "sequelize";
import { SignInAttempt } from "@/db/models";

export const WINDOW_MINUTES = 15;
export const MAX_PER_EMAIL = 5;
export const MAX_PER_IP = 30;

export async function tooManyFailures(email: string, ip: string, now = new Date()): Promise<boolean> {
  const since = new Date(now.getTime() - WINDOW_MINUTES * 60_000);
  const [byEmail, byIp] = await Promise.all([
    SignInAttempt.count({ where: { email, at: { [Op.gte]: since } } }),
    SignInAttempt.count({ where: { ip, at: { [Op.gte]: since } } }),
  ]);
  return byEmail >= MAX_PER_EMAIL || byIp >= MAX_PER_IP;
}

export async function recordFailure(email: string, ip: string) {
  await SignInAttempt.create({ email, ip });
}

/** A success clears the e-mail's failures, so a typo earlier in the window does not count later. */
export async function clearFailures(email: string) {
  await SignInAttempt.destroy({ where: { email } });
}
