// When a visit's reminders are due, and the idempotency key that names each message once.
// Pure functions: the hooks, the worker and the tests share them.

/** Common practice: 48 h and 2 h before the visit (REFERENCES.md, [C]). */
export const DEFAULT_REMINDER_HOURS = [48, 2] as const;

export type ReminderPlan = { hoursBefore: number; dueAt: Date; skip: boolean };

/**
 * The clinic's reminder hours, cleaned: whole positive hours up to four weeks, largest first,
 * no repeats. A missing or empty setting falls back to the default.
 */
export function reminderHours(setting: unknown): number[] {
  const list = Array.isArray(setting) ? setting : [];
  const clean = [...new Set(list.map(Number).filter((h) => Number.isInteger(h) && h > 0 && h <= 672))];
  return (clean.length ? clean : [...DEFAULT_REMINDER_HOURS]).sort((a, b) => b - a);
}

/**
 * One entry per reminder hour. A reminder whose time has already passed (or is now) when the
 * visit is confirmed is marked `skip`: it is not sent late.
 */
export function planReminders(startsAt: Date, hoursSetting: unknown, now: Date): ReminderPlan[] {
  return reminderHours(hoursSetting).map((hoursBefore) => {
    const dueAt = new Date(startsAt.getTime() - hoursBefore * 3_600_000);
    return { hoursBefore, dueAt, skip: dueAt.getTime() <= now.getTime() };
  });
}

/**
 * A reminder picked up late (the worker was down) is still worth sending only while the visit
 * has not started and no later reminder for the same visit is due too.
 */
export function reminderStillUseful(r: { dueAt: Date; visitStartsAt: Date }, laterDueAts: Date[], now: Date): boolean {
  if (now.getTime() >= r.visitStartsAt.getTime()) return false;
  return !laterDueAts.some((d) => d.getTime() > r.dueAt.getTime() && d.getTime() <= now.getTime());
}

/** Visit + kind + start time: the same message about the same visit time is sent once, ever. */
export function idempotencyKey(appointmentId: string, kind: string, startsAt: Date): string {
  return `${appointmentId}/${kind}/${startsAt.toISOString()}`;
}

export function reminderKind(hoursBefore: number): string {
  return `reminder-${hoursBefore}h`;
}

/** "2 hours 30 minutes" for the length of a visit. */
export function durationWords(minutes: number): string {
  const h = Math.floor(minutes / 60);
  const m = Math.round(minutes % 60);
  const parts = [];
  if (h) parts.push(`${h} hour${h === 1 ? "" : "s"}`);
  if (m || !h) parts.push(`${m} minute${m === 1 ? "" : "s"}`);
  return parts.join(" ");
}

/** "in about 2 hours" / "in 2 days": how far off the visit is, for a reminder's heading. */
export function timeUntilWords(from: Date, to: Date): string {
  const minutes = Math.max(0, Math.round((to.getTime() - from.getTime()) / 60_000));
  if (minutes < 90) return `in about ${minutes} minute${minutes === 1 ? "" : "s"}`;
  const hours = Math.round(minutes / 60);
  if (hours < 36) return `in about ${hours} hours`;
  return `in ${Math.round(hours / 24)} days`;
}
