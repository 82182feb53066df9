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
// One formatter per zone, kept: building an Intl.DateTimeFormat costs far more than formatting with
// one, and the day board formats several hundred instants per request.
const wallClock = new Map<string, Intl.DateTimeFormat>();

export function isoInZone(instant: Date, zone: string): string {
  let format = wallClock.get(zone);
  if (!format) {
    format = new Intl.DateTimeFormat("en-US", {
      timeZone: zone, hourCycle: "h23", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", second: "2-digit",
    });
    wallClock.set(zone, format);
  }
  const part: Record<string, string> = {};
  for (const p of format.formatToParts(instant)) part[p.type] = p.value;
  const [y, mo, d, h, mi, s] = [part.year, part.month, part.day, part.hour, part.minute, part.second].map(Number);
  // The offset is the wall clock read as UTC minus the instant (to the whole second, as displayed).
  const offsetMinutes = Math.round((Date.UTC(y, mo - 1, d, h, mi, s) - Math.floor(instant.getTime() / 1000) * 1000) / 60_000);
  const sign = offsetMinutes < 0 ? "-" : "+";
  const abs = Math.abs(offsetMinutes);
  const two = (n: number) => String(n).padStart(2, "0");
  return `${String(y).padStart(4, "0")}-${two(mo)}-${two(d)}T${two(h)}:${two(mi)}:${two(s)}${sign}${two(Math.floor(abs / 60))}:${two(abs % 60)}`;
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
