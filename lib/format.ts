// Formatting for people: money, durations, times in the clinic's zone. Thin wrappers over
// lib/i18n/format.ts; staff pages use the English default, patient pages pass their locale.
import { formatClock, formatDateTime, formatDuration, formatMoney } from "@/lib/i18n/format";
import type { Locale } from "@/lib/i18n/locale";

export function money(cents: number, currency = "CAD", locale: Locale = "en"): string {
  return formatMoney(cents, currency, locale);
}

/** 167 → "2 h 47 min" */
export function duration(minutes: number, locale: Locale = "en"): string {
  return formatDuration(minutes, locale);
}

export function when(instant: Date | string, zone: string, locale: Locale = "en"): string {
  return formatDateTime(instant, zone, locale);
}

export function clock(instant: Date | string, zone: string, locale: Locale = "en"): string {
  return formatClock(instant, zone, locale);
}

export const MODE_WORDS = {
  rapid: { name: "Rapid", blurb: "The shortest visit. A smooth polished surface; fine detail is simpler." },
  standard: { name: "Standard", blurb: "A balance of visit length and surface detail." },
  refined: { name: "Refined", blurb: "The most careful surface and edge detail, for the longest visit." },
} as const;

export const STATUS_WORDS: Record<string, string> = {
  requested: "Waiting for the clinic to confirm",
  confirmed: "Confirmed",
  checked_in: "Checked in",
  in_progress: "In progress",
  completed: "Completed",
  declined: "Declined by the clinic",
  cancelled: "Cancelled",
  no_show: "Missed",
};
