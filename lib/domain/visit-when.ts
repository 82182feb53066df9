// A visit's time in words, in the clinic's own time zone and naming that zone, for e-mails and
// calendar text. Intl's time-zone data does the conversion (so daylight saving is right).

export type VisitWhen = {
  /** "Monday 15 March 2027" */
  date: string;
  /** "10:00" (24-hour clock, unambiguous in every English locale) */
  start: string;
  end: string;
  /** "Eastern Daylight Time" */
  zoneName: string;
  /** "EDT" (or "GMT-4" where the zone has no common abbreviation) */
  zoneShort: string;
  /** "Monday 15 March 2027, 10:00–12:30 Eastern Daylight Time" */
  line: string;
};

// Building an Intl.DateTimeFormat is the expensive part; the worker formats thousands of times.
const formats = new Map<string, Intl.DateTimeFormat>();
function format(locale: string, zone: string, opts: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${locale}|${zone}|${JSON.stringify(opts)}`;
  let f = formats.get(key);
  if (!f) formats.set(key, (f = new Intl.DateTimeFormat(locale, { timeZone: zone, ...opts })));
  return f;
}

function zonePart(instant: Date, locale: string, zone: string, style: "long" | "short"): string {
  return format(locale, zone, { timeZoneName: style }).formatToParts(instant).find((p) => p.type === "timeZoneName")?.value ?? "";
}

export function clockTime(instant: Date, zone: string): string {
  return format("en-GB", zone, { hour: "2-digit", minute: "2-digit", hourCycle: "h23" }).format(instant);
}

export function longDate(instant: Date, zone: string): string {
  // en-GB gives "Monday 15 March 2027" (weekday, day, month, year) without commas.
  return format("en-GB", zone, { weekday: "long", day: "numeric", month: "long", year: "numeric" }).format(instant).replace(",", "");
}

export function zoneNames(instant: Date, zone: string): { long: string; short: string } {
  return {
    long: zonePart(instant, "en-GB", zone, "long") || zone,
    // en-US knows the North American abbreviations (EST/EDT); other zones fall back to "GMT+1" style.
    short: zonePart(instant, "en-US", zone, "short") || zone,
  };
}

export function visitWhen(startsAt: Date, endsAt: Date, zone: string): VisitWhen {
  const names = zoneNames(startsAt, zone);
  const date = longDate(startsAt, zone);
  const start = clockTime(startsAt, zone);
  const end = clockTime(endsAt, zone);
  return { date, start, end, zoneName: names.long, zoneShort: names.short, line: `${date}, ${start}–${end} ${names.long}` };
}

/** "Mon 15 Mar, 10:00 EDT" for subject lines. */
export function shortWhen(instant: Date, zone: string): string {
  const d = format("en-GB", zone, { weekday: "short", day: "numeric", month: "short" }).format(instant).replace(",", "");
  return `${d}, ${clockTime(instant, zone)} ${zoneNames(instant, zone).short}`;
}
