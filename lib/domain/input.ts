// Shared zod pieces for ids and dates, used by forms and the server alike: an id must be a UUID
// and a date a real calendar date, so impossible values are refused instead of rolled over.
import { z } from "zod";

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** True for a YYYY-MM-DD that names a real day of the Gregorian calendar (2027-02-30 is not). */
export function isCalendarDate(value: string): boolean {
  const m = ISO_DATE.exec(value);
  if (!m) return false;
  const [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (year < 1 || month < 1 || month > 12 || day < 1) return false;
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  const days = [31, leap ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][month - 1];
  return day <= days;
}

/** True for a HH:MM or HH:MM:SS(.fff) wall-clock time within one day. */
export function isClockTime(value: string): boolean {
  const m = /^(\d{2}):(\d{2})(?::(\d{2})(?:\.\d+)?)?$/.exec(value);
  return !!m && Number(m[1]) < 24 && Number(m[2]) < 60 && (m[3] === undefined || Number(m[3]) < 60);
}

export const UUID_MESSAGE = (what: string) => `${what} is not a valid id.`;

/** A record id (UUID). */
export const idSchema = (what = "The id") =>
  z.uuid({ error: (issue) => (issue.input === undefined ? `${what} is required.` : UUID_MESSAGE(what)) });

/** A clinic-local calendar day, YYYY-MM-DD. */
export const calendarDateSchema = (what = "The date") =>
  z.string({ message: `${what} is required.` }).refine(isCalendarDate, { message: `${what} must be a real date written YYYY-MM-DD, like 2027-03-15.` });

/** A clinic-local wall-clock date and time as a datetime-local field gives it (YYYY-MM-DDTHH:MM). */
export const localDateTimeSchema = (what = "The time") =>
  z
    .string({ message: `Enter the ${what} date and time.` })
    .refine((s) => /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/.test(s) && isCalendarDate(s.slice(0, 10)) && isClockTime(s.slice(11)), {
      message: `Enter the ${what} as a real date and time.`,
    });

const INSTANT = /^(\d{4}-\d{2}-\d{2})T(\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?)(Z|[+-](\d{2}):(\d{2}))$/;

/** True for an ISO 8601 date and time with its offset whose every part is real. */
export function isInstant(value: string): boolean {
  const m = INSTANT.exec(value);
  if (!m || !isCalendarDate(m[1]) || !isClockTime(m[2])) return false;
  return m[3] === "Z" || (Number(m[4]) <= 14 && Number(m[5]) < 60);
}

/** An instant written ISO 8601 with its offset (2027-03-15T08:00:00-04:00), parsed to a Date. */
export const instantSchema = (field = "start") =>
  z
    .string({ message: `${field} is required.` })
    .refine(isInstant, { message: `${field} must be a real ISO 8601 date and time with its offset, e.g. 2027-03-15T08:00:00-04:00.` })
    .transform((s) => new Date(s));
