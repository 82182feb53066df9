// Formatting for people, in one place: dates, times, durations and money through Intl, in the
// reader's language and always in the clinic's own time zone (so daylight saving is Intl's job).
// Pure: no framework imports, so pages, e-mails, the calendar file and the PDFs share it.
import { INTL_TAG, type Locale } from "./locale";

// Building an Intl formatter is the expensive part; the mail worker formats thousands of times.
const cache = new Map<string, Intl.DateTimeFormat | Intl.NumberFormat>();
function dateFormat(locale: Locale, zone: string, opts: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `d|${locale}|${zone}|${JSON.stringify(opts)}`;
  let f = cache.get(key) as Intl.DateTimeFormat | undefined;
  if (!f) cache.set(key, (f = new Intl.DateTimeFormat(INTL_TAG[locale], { timeZone: zone, ...opts })));
  return f;
}
function numberFormat(locale: Locale, opts: Intl.NumberFormatOptions): Intl.NumberFormat {
  const key = `n|${locale}|${JSON.stringify(opts)}`;
  let f = cache.get(key) as Intl.NumberFormat | undefined;
  if (!f) cache.set(key, (f = new Intl.NumberFormat(INTL_TAG[locale], opts)));
  return f;
}

export const DATE_TIME: Intl.DateTimeFormatOptions = { weekday: "short", day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZoneName: "short" };
export const LONG_DATE: Intl.DateTimeFormatOptions = { weekday: "long", day: "numeric", month: "long", year: "numeric" };
export const LONG_DATE_TIME: Intl.DateTimeFormatOptions = { ...LONG_DATE, hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZoneName: "short" };
export const CLOCK: Intl.DateTimeFormatOptions = { hour: "2-digit", minute: "2-digit", hourCycle: "h23" };
export const SHORT_DAY: Intl.DateTimeFormatOptions = { weekday: "short", day: "numeric", month: "short" };

/** "Mon, Mar 15, 2027, 08:00 EDT" / "lun. 15 mars 2027, 08 h 00 HAE": an instant for a screen. */
export function formatDateTime(instant: Date | string, zone: string, locale: Locale): string {
  return dateFormat(locale, zone, DATE_TIME).format(new Date(instant));
}

/** "Monday, March 15, 2027, 08:00 EDT": an instant in full, for the consent and its PDF. */
export function formatLongDateTime(instant: Date | string, zone: string, locale: Locale): string {
  return dateFormat(locale, zone, LONG_DATE_TIME).format(new Date(instant));
}

/** "Monday, March 15, 2027" / "lundi 15 mars 2027", the clinic-local date of an instant. */
export function formatLongDate(instant: Date | string, zone: string, locale: Locale): string {
  return dateFormat(locale, zone, LONG_DATE).format(new Date(instant));
}

/** "Tuesday, July 14, 2026 at 9:30 a.m. EDT" / "mardi 14 juillet 2026 à 9 h 30 HAE": the visit in a consent text. */
export function formatConsentDate(instant: Date | string, zone: string, locale: Locale): string {
  return dateFormat(locale, zone, { weekday: "long", day: "numeric", month: "long", year: "numeric", hour: "numeric", minute: "2-digit", timeZoneName: "short" }).format(new Date(instant));
}

/** "08:00" / "08 h 00": 24-hour wall-clock time in the zone. */
export function formatClock(instant: Date | string, zone: string, locale: Locale): string {
  return dateFormat(locale, zone, CLOCK).format(new Date(instant));
}

/** A calendar date ("YYYY-MM-DD", no zone) as a short day: "Mon, Mar 15" / "lun. 15 mars". */
export function formatDay(date: string, locale: Locale, opts: Intl.DateTimeFormatOptions = SHORT_DAY): string {
  return dateFormat(locale, "UTC", opts).format(new Date(`${date}T12:00:00Z`));
}

/** The zone's name at that instant: short ("EDT" / "HAE") or long ("Eastern Daylight Time"). */
export function formatZoneName(instant: Date | string, zone: string, locale: Locale, style: "short" | "long" = "short"): string {
  return dateFormat(locale, zone, { timeZoneName: style }).formatToParts(new Date(instant)).find((p) => p.type === "timeZoneName")?.value ?? zone;
}

/** Cents as money in the reader's conventions: 20000 CAD → "$200.00" / "200,00 $". */
export function formatMoney(cents: number, currency: string, locale: Locale): string {
  return numberFormat(locale, { style: "currency", currency }).format(cents / 100);
}

/** 167 → "2 h 47 min" (SI symbols, read the same in English and French), numbers through Intl. */
export function formatDuration(minutes: number, locale: Locale): string {
  const n = numberFormat(locale, { maximumFractionDigits: 0 });
  const h = Math.floor(minutes / 60);
  const m = Math.round(minutes % 60);
  if (!h) return `${n.format(m)} min`;
  return m ? `${n.format(h)} h ${n.format(m)} min` : `${n.format(h)} h`;
}

/** A list in the reader's language: ["48 hours", "2 hours"] → "48 hours and 2 hours" / "… et …". */
export function formatList(items: string[], locale: Locale): string {
  return new Intl.ListFormat(INTL_TAG[locale], { style: "long", type: "conjunction" }).format(items);
}
