// Clinic-local times against a general-purpose reference: dayjs with its utc and timezone plugins
// (the implementation this module used before, kept here as the reference), over two years of
// instants in zones with half-hour, 45-minute and half-hour-summer-time offsets.
import dayjs from "dayjs";
import timezone from "dayjs/plugin/timezone";
import utc from "dayjs/plugin/utc";
import { describe, expect, it } from "vitest";
import { isoInZone, localDate, localTime, zonedTime } from "@/lib/domain/time-zone";

dayjs.extend(utc);
dayjs.extend(timezone);

const ZONES = ["America/Toronto", "Europe/Paris", "Australia/Lord_Howe", "Asia/Kolkata", "UTC", "America/St_Johns", "Pacific/Chatham"];

describe("time zones", () => {
  it("reads instants as dayjs does: date, time and ISO 8601 with the offset", () => {
    for (const zone of ZONES) {
      // Every 19 h 13 min 17 s over 2026 and 2027: all hours of the day and both sides of every change.
      for (let t = Date.UTC(2026, 0, 1); t < Date.UTC(2028, 0, 1); t += (19 * 60 + 13) * 60_000 + 17_000) {
        const d = new Date(t);
        // [C] reference: dayjs 1.11 with the utc and timezone plugins
        expect(isoInZone(d, zone)).toBe(dayjs(d).tz(zone).format("YYYY-MM-DDTHH:mm:ssZ"));
        expect(localDate(d, zone)).toBe(dayjs(d).tz(zone).format("YYYY-MM-DD"));
        expect(localTime(d, zone)).toBe(dayjs(d).tz(zone).format("HH:mm"));
      }
    }
  });

  it("turns wall-clock times into the instants dayjs gives, wherever the time occurs exactly once", () => {
    let compared = 0;
    for (const zone of ZONES) {
      for (let day = 0; day < 730; day += 3) {
        const date = new Date(Date.UTC(2026, 0, 1 + day)).toISOString().slice(0, 10);
        for (const time of ["00:00", "02:30", "07:45", "12:00", "18:15", "23:30"]) {
          const at = zonedTime(date, time, zone);
          // A time skipped or repeated by a change of offset has no single answer (dayjs picks by
          // today's offset); those are left out, the others must agree and read back unchanged.
          const once = [-3, -2, -1, 1, 2, 3].every((h) => localTime(new Date(at.getTime() + h * 30 * 60_000), zone) !== time);
          if (!once || localTime(at, zone) !== time) continue;
          expect(localDate(at, zone)).toBe(date);
          // [C] reference: dayjs 1.11 with the utc and timezone plugins
          expect(at.getTime()).toBe(dayjs.tz(`${date} ${time}`, "YYYY-MM-DD HH:mm", zone).toDate().getTime());
          compared++;
        }
      }
    }
    expect(compared).toBeGreaterThan(ZONES.length * 240 * 5);
  });

  it("reads an invalid date as dayjs did, without throwing", () => {
    const bad = new Date(NaN);
    // [C] reference: dayjs 1.11 formats an invalid date as "Invalid Date"
    expect(isoInZone(bad, "America/Toronto")).toBe(dayjs(bad).tz("America/Toronto").format("YYYY-MM-DDTHH:mm:ssZ"));
    expect(localDate(bad, "America/Toronto")).toBe("Invalid Date");
    expect(localTime(bad, "America/Toronto")).toBe("Invalid Date");
  });

  it("gives a time skipped by the change to summer time an instant after the change", () => {
    // [M] from memory: in 2027 Toronto moves from 02:00 EST to 03:00 EDT on 14 March (second Sunday of March).
    const at = zonedTime("2027-03-14", "02:30", "America/Toronto");
    expect(localDate(at, "America/Toronto")).toBe("2027-03-14");
    expect(localTime(at, "America/Toronto")).toBe("03:30");
  });
});
