// Words for e-mails, rendered outside a request: a translator over the same catalogues the pages use,
// and a visit's time in words in the patient's language.
import { createTranslator } from "next-intl";
import { visitWhen, type VisitWhen } from "@/lib/domain/visit-when";
import { formatClock, formatDay, formatLongDate, formatZoneName } from "./format";
import type { Locale } from "./locale";
import { messagesFor } from "./messages";

export function emailTranslator(locale: Locale) {
  return createTranslator({ locale, messages: messagesFor(locale), namespace: "email" });
}
export type EmailT = ReturnType<typeof emailTranslator>;

/** The visit's time in words; English keeps lib/domain/visit-when.ts's wording. */
export function localVisitWhen(startsAt: Date, endsAt: Date, zone: string, locale: Locale): VisitWhen {
  if (locale === "en") return visitWhen(startsAt, endsAt, zone);
  const date = formatLongDate(startsAt, zone, locale);
  const start = formatClock(startsAt, zone, locale);
  const end = formatClock(endsAt, zone, locale);
  const zoneName = formatZoneName(startsAt, zone, locale, "long");
  return { date, start, end, zoneName, zoneShort: formatZoneName(startsAt, zone, locale, "short"), line: `${date}, ${start}–${end} ${zoneName}` };
}

/** "lun. 15 mars, 10 h 00 HAE" for subject lines (English keeps shortWhen in visit-when.ts). */
export function localShortWhen(instant: Date, zone: string, locale: Locale): string {
  const day = new Intl.DateTimeFormat("en-CA", { timeZone: zone, year: "numeric", month: "2-digit", day: "2-digit" }).format(instant);
  return `${formatDay(day, locale)}, ${formatClock(instant, zone, locale)} ${formatZoneName(instant, zone, locale, "short")}`;
}

/** "2 hours 30 minutes" / "2 heures 30 minutes" */
export function lengthWords(minutes: number, t: EmailT): string {
  const h = Math.floor(minutes / 60);
  const m = Math.round(minutes % 60);
  const parts: string[] = [];
  if (h) parts.push(t("hours", { count: h }));
  if (m || !h) parts.push(t("minutes", { count: m }));
  return parts.join(" ");
}

/** "in about 2 hours" / "dans environ 2 heures", how far off the visit is. */
export function timeUntil(from: Date, to: Date, t: EmailT): string {
  const minutes = Math.max(0, Math.round((to.getTime() - from.getTime()) / 60_000));
  if (minutes < 90) return t("inMinutes", { count: minutes });
  const hours = Math.round(minutes / 60);
  if (hours < 36) return t("inHours", { count: hours });
  return t("inDays", { count: Math.round(hours / 24) });
}
