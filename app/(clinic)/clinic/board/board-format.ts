// Small formatting helpers for the board's client views. Times arrive as ISO 8601 strings in the
// clinic's zone (with its offset), so the wall-clock part can be read straight from the string.
import type { Mode, StageKey } from "@/lib/domain/types";

export const hhmm = (iso: string) => iso.slice(11, 16);
export const ms = (iso: string) => Date.parse(iso);

export const MODE_LABEL: Record<Mode, string> = { rapid: "rapid", standard: "standard", refined: "refined" };

export const STATE_LABEL = { planned: "Planned", running: "Running", done: "Done" } as const;

export const KIND_LABEL = { chair: "Chairs", mill: "Mills", furnace: "Furnaces" } as const;

export const STATUS_LABEL: Record<string, string> = {
  requested: "Requested", confirmed: "Confirmed", checked_in: "Checked in", in_progress: "In progress",
  completed: "Completed", declined: "Declined", cancelled: "Cancelled", no_show: "No-show",
};

export function shiftText(minutes: number): string {
  if (minutes === 0) return "on time";
  return minutes > 0 ? `${minutes} min late` : `${-minutes} min early`;
}

export function visitLabel(v: { initials: string; tooth: { fdi: number }; material: string; mode: Mode }): string {
  return `${v.initials} · ${v.tooth.fdi} · ${v.material} · ${MODE_LABEL[v.mode]}`;
}

export function addDays(day: string, n: number): string {
  const d = new Date(`${day}T12:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
}

export function longDay(day: string): string {
  return new Intl.DateTimeFormat("en-GB", { weekday: "long", day: "numeric", month: "long", year: "numeric", timeZone: "UTC" }).format(new Date(`${day}T12:00:00Z`));
}

export type { StageKey };

/** Wall-clock HH:MM of an instant, using the UTC offset written at the end of a clinic ISO time. */
export function clockAt(instant: number, offsetFrom: string): string {
  const offset = offsetFrom.slice(19);
  if (offset === "Z" || offset === "") return new Date(instant).toISOString().slice(11, 16);
  const sign = offset.startsWith("-") ? -1 : 1;
  const [h, m] = offset.slice(1).split(":").map(Number);
  return new Date(instant + sign * (h * 60 + m) * 60_000).toISOString().slice(11, 16);
}
