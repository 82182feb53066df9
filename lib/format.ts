// Formatting for people: money, durations, times in the clinic's zone.
import { formatLocal, zoneAbbreviation } from "@/lib/domain/time-zone";

export function money(cents: number, currency = "CAD"): string {
  return new Intl.NumberFormat("en-CA", { style: "currency", currency }).format(cents / 100);
}

/** 167 → "2 h 47 min" */
export function duration(minutes: number): string {
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  return h ? (m ? `${h} h ${m} min` : `${h} h`) : `${m} min`;
}

export function when(instant: Date | string, zone: string): string {
  const d = new Date(instant);
  return `${formatLocal(d, zone)} ${zoneAbbreviation(d, zone)}`;
}

export function clock(instant: Date | string, zone: string): string {
  return new Intl.DateTimeFormat("en-CA", { timeZone: zone, hour: "2-digit", minute: "2-digit", hourCycle: "h23" }).format(new Date(instant));
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
