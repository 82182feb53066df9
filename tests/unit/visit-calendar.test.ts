// The .ics attached to visit e-mails, parsed back with a general-purpose iCalendar library
// (ical.js) and checked against RFC 5545 and Intl's time-zone data.
import ICAL from "ical.js";
import { describe, expect, it } from "vitest";
import { visitCalendar, visitUid } from "@/lib/domain/visit-calendar";
import { zonedTime } from "@/lib/domain/time-zone";
import { visitWhen } from "@/lib/domain/visit-when";

const ZONE = "America/Toronto";
const ID = "2f1d7c64-8a7e-4c1b-9a59-0d6b3c2e4f10";

function build(startsAt: Date, minutes = 150, extra: Partial<Parameters<typeof visitCalendar>[0]> = {}) {
  return visitCalendar({
    appointmentId: ID,
    startsAt,
    endsAt: new Date(startsAt.getTime() + minutes * 60_000),
    clinicName: "Alder Bay Dental Studio",
    clinicAddress: "14 Quayside Row, Alder Bay",
    organizerEmail: "no-reply@cuspal.test",
    toothWords: "lower left first molar",
    materialName: "Zirconia",
    sequence: 0,
    stamp: new Date("2027-03-01T09:00:00Z"),
    ...extra,
  });
}

function parse(text: string) {
  const vcalendar = new ICAL.Component(ICAL.parse(text));
  const vevent = vcalendar.getFirstSubcomponent("vevent")!;
  return { vcalendar, vevent, event: new ICAL.Event(vevent) };
}

function localParts(instant: Date) {
  const f = new Intl.DateTimeFormat("en-CA", { timeZone: ZONE, year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZoneName: "short" });
  const p = Object.fromEntries(f.formatToParts(instant).map((x) => [x.type, x.value]));
  return { date: `${p.year}-${p.month}-${p.day}`, time: `${p.hour}:${p.minute}`, zone: p.timeZoneName };
}

describe("visit calendar file", () => {
  it("has the parts RFC 5545 requires, readable by a general-purpose parser", () => {
    const text = build(new Date("2027-03-15T14:00:00Z"));
    const { vcalendar, vevent, event } = parse(text);
    // [M] from memory: VCALENDAR needs PRODID and VERSION:2.0.
    expect(vcalendar.getFirstPropertyValue("version")).toBe("2.0");
    expect(vcalendar.getFirstPropertyValue("prodid")).toBeTruthy();
    // METHOD present (the brief's requirement); PUBLISH = a copy for the calendar, no reply expected.
    expect(vcalendar.getFirstPropertyValue("method")).toBe("PUBLISH");
    // [P] RFC 5545 §3.6.1: VEVENT requires DTSTAMP and UID; DTEND or DURATION, never both.
    expect(event.uid).toBe(visitUid(ID));
    expect(vevent.getFirstPropertyValue("dtstamp")?.toString()).toBe("2027-03-01T09:00:00Z");
    expect(vevent.hasProperty("dtstart")).toBe(true);
    expect(vevent.hasProperty("dtend")).toBe(true);
    expect(vevent.hasProperty("duration")).toBe(false);
    expect(event.summary).toBe("Crown visit at Alder Bay Dental Studio");
    expect(event.location).toBe("Alder Bay Dental Studio, 14 Quayside Row, Alder Bay");
    // [M] VALARM needs ACTION and TRIGGER, e.g. -PT2H.
    const alarm = vevent.getFirstSubcomponent("valarm")!;
    expect(alarm.getFirstPropertyValue("action")).toBe("DISPLAY");
    expect(String(alarm.getFirstPropertyValue("trigger"))).toBe("-PT2H");
    expect(alarm.getFirstPropertyValue("description")).toBeTruthy();
  });

  it("ends every line with CRLF and folds long lines at 75 octets", () => {
    const text = build(new Date("2027-03-15T14:00:00Z"), 150, { clinicAddress: "A very long address line ".repeat(8).trim() });
    expect(text.endsWith("\r\n")).toBe(true);
    const lines = text.split("\r\n").slice(0, -1);
    expect(lines.every((l) => !l.includes("\n"))).toBe(true);
    // [M] from memory: content lines fold at 75 octets (RFC 5545 §3.1).
    expect(Math.max(...lines.map((l) => Buffer.byteLength(l)))).toBeLessThanOrEqual(75);
    expect(lines.some((l) => l.startsWith(" "))).toBe(true);
  });

  it("keeps the UID per visit and raises SEQUENCE for a changed copy; a cancelled copy says so", () => {
    const a = parse(build(new Date("2027-03-15T14:00:00Z")));
    const b = parse(build(new Date("2027-03-16T14:00:00Z"), 150, { sequence: 1 }));
    const c = parse(build(new Date("2027-03-16T14:00:00Z"), 150, { sequence: 2, cancelled: true }));
    expect(b.event.uid).toBe(a.event.uid);
    expect(c.event.uid).toBe(a.event.uid);
    expect([a.event.sequence, b.event.sequence, c.event.sequence]).toEqual([0, 1, 2]);
    expect(c.vevent.getFirstPropertyValue("status")).toBe("CANCELLED");
    expect(c.vevent.getFirstSubcomponent("valarm")).toBeNull();
  });

  it("places a 10:00 Toronto visit at the right instant on both sides of the March 2027 change to daylight time", () => {
    // [M] from memory: Toronto moves to daylight time on the second Sunday of March (14 March 2027),
    // from UTC−5 (EST) to UTC−4 (EDT). Intl's time-zone data is the reference below.
    const before = zonedTime("2027-03-12", "10:00", ZONE);
    const after = zonedTime("2027-03-15", "10:00", ZONE);
    expect(before.toISOString()).toBe("2027-03-12T15:00:00.000Z");
    expect(after.toISOString()).toBe("2027-03-15T14:00:00.000Z");

    for (const [start, date, zone] of [[before, "2027-03-12", "EST"], [after, "2027-03-15", "EDT"]] as const) {
      const { event } = parse(build(start));
      const dtstart = event.startDate.toJSDate();
      const dtend = event.endDate.toJSDate();
      expect(dtstart.getTime()).toBe(start.getTime());
      expect(dtend.getTime() - dtstart.getTime()).toBe(150 * 60_000);
      // The parsed instant, read back through Intl in the clinic's zone, is 10:00 local on that day.
      expect(localParts(dtstart)).toEqual({ date, time: "10:00", zone });
      expect(localParts(dtend).time).toBe("12:30");
      // The e-mail text names the same local time and the zone.
      const when = visitWhen(start, dtend, ZONE);
      expect([when.start, when.end, when.zoneShort]).toEqual(["10:00", "12:30", zone]);
      expect(when.zoneName).toBe(zone === "EST" ? "Eastern Standard Time" : "Eastern Daylight Time");
    }
  });
});
