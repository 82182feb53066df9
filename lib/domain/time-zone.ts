// Clinic-local wall-clock times ⇄ instants, from the Intl time-zone data. One formatter per zone is
// made once and reused: a formatter is costly to build, and a search converts hundreds of instants.

type Wall = { year: number; month: number; day: number; hour: number; minute: number; second: number };

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(zone: string): Intl.DateTimeFormat {
  let f = formatters.get(zone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-US", {
      timeZone: zone, hourCycle: "h23", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", second: "2-digit",
    });
    formatters.set(zone, f);
  }
  return f;
}

/** The wall-clock reading of an instant in a zone. */
function wallAt(ms: number, zone: string): Wall {
  const w: Wall = { year: 0, month: 0, day: 0, hour: 0, minute: 0, second: 0 };
  for (const part of formatterFor(zone).formatToParts(ms)) {
    if (part.type in w) w[part.type as keyof Wall] = Number(part.value);
  }
  if (w.hour === 24) w.hour = 0;
  return w;
}

/** The zone's offset from UTC at an instant, in minutes (east positive), from its wall reading. */
function offsetOf(ms: number, w: Wall): number {
  const whole = ms - (((ms % 1000) + 1000) % 1000);
  return (Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second) - whole) / 60_000;
}

const DAY = 86_400_000;
const MAX_STEADY_DAYS = 20_000;
// Per zone: UTC day number → the zone's offset all that day, or null on a day its offset changes.
const steadyDays = new Map<string, Map<number, number | null>>();
let steadyCount = 0;

/** The zone's offset (minutes) at an instant. Offsets change a few times a year, so one read at each
 *  end of the instant's UTC day serves every instant of that day when the two agree (no zone changes
 *  its offset twice in one day and back); on the day of a change, each instant is read on its own.
 *  A search formats hundreds of instants over a fortnight: ~30 readings instead of hundreds. */
function offsetAt(ms: number, zone: string): number {
  const day = Math.floor(ms / DAY);
  let days = steadyDays.get(zone);
  if (!days) steadyDays.set(zone, (days = new Map()));
  let steady = days.get(day);
  if (steady === undefined) {
    const first = offsetOf(day * DAY, wallAt(day * DAY, zone));
    const last = offsetOf((day + 1) * DAY - 1000, wallAt((day + 1) * DAY - 1000, zone));
    // Offsets of whole minutes only: older local mean times (seconds) are read one by one.
    steady = first === last && Number.isInteger(first) ? first : null;
    if (++steadyCount > MAX_STEADY_DAYS) {
      steadyDays.clear();
      steadyCount = 1;
      steadyDays.set(zone, (days = new Map()));
    }
    days.set(day, steady);
  }
  return steady ?? offsetOf(ms, wallAt(ms, zone));
}

/** The wall-clock reading of an instant in a zone: its offset, then arithmetic (no Date objects,
 *  which the server runtime wraps and makes costly). */
function wallFast(ms: number, zone: string, offset = offsetAt(ms, zone)): Wall {
  const local = Math.floor(ms / 1000) + offset * 60;
  const days = Math.floor(local / 86_400);
  const secs = local - days * 86_400;
  const { year, month, day } = civilFromDays(days);
  return { year, month, day, hour: Math.floor(secs / 3600), minute: Math.floor((secs % 3600) / 60), second: secs % 60 };
}

/** Proleptic Gregorian year, month and day of a count of days since 1970-01-01: Howard Hinnant's
 *  public-domain `civil_from_days` ("chrono-Compatible Low-Level Date Algorithms"). */
function civilFromDays(z: number): { year: number; month: number; day: number } {
  z += 719_468;
  const era = Math.floor(z / 146_097);
  const doe = z - era * 146_097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36_524) - Math.floor(doe / 146_096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const day = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const month = mp < 10 ? mp + 3 : mp - 9;
  return { year: yoe + era * 400 + (month <= 2 ? 1 : 0), month, day };
}

const pad = (n: number, width = 2) => String(n).padStart(width, "0");

// What an invalid date reads as, as before (dayjs's wording): callers show or compare it, never crash.
const INVALID = "Invalid Date";

/** The instant of a wall-clock time ("YYYY-MM-DD", "HH:MM[:SS]") in an IANA zone. A time skipped by
 *  a change to summer time lands after the change; a time that occurs twice takes the instant the
 *  zone's offset at that wall time (read as UTC) gives, whatever today's date. */
export function zonedTime(date: string, time: string, zone: string): Date {
  const [y, mo, d] = date.split("-").map(Number);
  const [h, mi] = time.slice(0, 5).split(":").map(Number);
  const local = Date.UTC(y, mo - 1, d, h, mi);
  // Guess with the offset at the wall time read as UTC, then correct once or twice.
  const o0 = offsetAt(local, zone);
  let guess = local - o0 * 60_000;
  const o2 = offsetAt(guess, zone);
  if (o0 === o2) return new Date(guess);
  guess -= (o2 - o0) * 60_000;
  const o3 = offsetAt(guess, zone);
  if (o2 === o3) return new Date(guess);
  return new Date(local - Math.min(o2, o3) * 60_000);
}

export function localDate(instant: Date, zone: string): string {
  if (Number.isNaN(instant.getTime())) return INVALID;
  const w = wallFast(instant.getTime(), zone);
  return `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}`;
}

export function localTime(instant: Date, zone: string): string {
  if (Number.isNaN(instant.getTime())) return INVALID;
  const w = wallFast(instant.getTime(), zone);
  return `${pad(w.hour)}:${pad(w.minute)}`;
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
  const ms = instant.getTime();
  if (Number.isNaN(ms)) return INVALID;
  const offset = offsetAt(ms, zone);
  const w = wallFast(ms, zone, offset);
  const sign = offset < 0 ? "-" : "+";
  return `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}:${pad(w.second)}${sign}${pad(Math.floor(Math.abs(offset) / 60))}:${pad(Math.abs(offset) % 60)}`;
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
