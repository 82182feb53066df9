// Clinic-local wall-clock times ⇄ instants, through dayjs's time-zone plugin (Intl data underneath).
import dayjs from "dayjs";
import timezone from "dayjs/plugin/timezone";
import utc from "dayjs/plugin/utc";

dayjs.extend(utc);
dayjs.extend(timezone);

/** The instant of a wall-clock time ("YYYY-MM-DD", "HH:MM[:SS]") in an IANA zone. */
export function zonedTime(date: string, time: string, zone: string): Date {
  return dayjs.tz(`${date} ${time.slice(0, 5)}`, "YYYY-MM-DD HH:mm", zone).toDate();
}

export function localDate(instant: Date, zone: string): string {
  return dayjs(instant).tz(zone).format("YYYY-MM-DD");
}

export function localTime(instant: Date, zone: string): string {
  return dayjs(instant).tz(zone).format("HH:mm");
}

/** 0 = Sunday … 6 = Saturday, for a calendar date (independent of zone). */
export function weekdayOf(date: string): number {
  return new Date(`${date}T12:00:00Z`).getUTCDay();
}

export function addDays(date: string, days: number): string {
  const d = new Date(`${date}T12:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** ISO 8601 with the zone's offset at that instant, e.g. 2027-03-15T08:00:00-04:00. */
export function isoInZone(instant: Date, zone: string): string {
  return dayjs(instant).tz(zone).format("YYYY-MM-DDTHH:mm:ssZ");
}

export function isValidZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat("en", { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

/** "Mon 15 Mar 2027, 08:00" in the zone, for people. */
export function formatLocal(instant: Date, zone: string, opts: Intl.DateTimeFormatOptions = {}): string {
  return new Intl.DateTimeFormat("en-CA", {
    timeZone: zone, weekday: "short", day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit", hourCycle: "h23", ...opts,
  }).format(instant);
}

export function zoneAbbreviation(instant: Date, zone: string): string {
  return new Intl.DateTimeFormat("en-US", { timeZone: zone, timeZoneName: "short" }).formatToParts(instant).find((p) => p.type === "timeZoneName")?.value ?? zone;
}
