// isoInZone formats with a cached Intl formatter; dayjs's time-zone plugin (the general-purpose
// library the rest of lib/domain/time-zone.ts uses) is the reference it must agree with.
import dayjs from "dayjs";
import timezone from "dayjs/plugin/timezone";
import utc from "dayjs/plugin/utc";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { isoInZone } from "@/lib/domain/time-zone";

dayjs.extend(utc);
dayjs.extend(timezone);

// Zones with DST, half-hour and 45-minute offsets, a 30-minute DST shift, and UTC itself.
const ZONES = ["America/Toronto", "Europe/Paris", "Asia/Kathmandu", "Australia/Lord_Howe", "America/St_Johns", "UTC", "Pacific/Chatham"];

describe("isoInZone", () => {
  it("agrees with dayjs for any instant from 1970 to 2100 in every sample zone", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 4_102_444_800_000 }), fc.constantFrom(...ZONES), (ms, zone) => {
        const at = new Date(ms);
        // [C] reference library: dayjs + its timezone plugin.
        expect(isoInZone(at, zone)).toBe(dayjs(at).tz(zone).format("YYYY-MM-DDTHH:mm:ssZ"));
      }),
      { numRuns: 3000 },
    );
  });

  it("agrees with the Intl time-zone data in every zone this runtime knows, on both sides of each change", () => {
    // [P] reference: the IANA time-zone database as shipped in the runtime's Intl (ECMA-402), read
    // through the test's own formatters (with the offset Intl itself prints), not ours.
    const zones = Intl.supportedValuesOf("timeZone");
    expect(zones.length).toBeGreaterThan(300);
    const formats = new Map<string, Intl.DateTimeFormat>();
    const viaIntl = (ms: number, zone: string) => {
      if (!formats.has(zone)) {
        formats.set(zone, new Intl.DateTimeFormat("en-US", { timeZone: zone, hourCycle: "h23", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", second: "2-digit", timeZoneName: "longOffset" }));
      }
      const parts = Object.fromEntries(formats.get(zone)!.formatToParts(ms).map((p) => [p.type, p.value]));
      const offset = parts.timeZoneName === "GMT" ? "+00:00" : parts.timeZoneName.slice(3);
      return `${parts.year}-${parts.month}-${parts.day}T${parts.hour === "24" ? "00" : parts.hour}:${parts.minute}:${parts.second}${offset}`;
    };
    let changes = 0;
    for (const zone of zones) {
      // Every six hours over 2026 finds each offset change (none undoes itself that fast); the
      // instants just before and after it, and noon on that UTC day, must read as Intl reads them.
      const STEP = 6 * 3_600_000;
      for (let t = Date.UTC(2026, 0, 1); t < Date.UTC(2027, 0, 1); t += STEP) {
        if (viaIntl(t, zone).slice(-6) === viaIntl(t + STEP, zone).slice(-6)) continue;
        changes++;
        let lo = t;
        let hi = t + STEP;
        while (hi - lo > 1000) {
          const mid = lo + Math.floor((hi - lo) / 2000) * 1000;
          if (viaIntl(mid, zone).slice(-6) === viaIntl(lo, zone).slice(-6)) lo = mid;
          else hi = mid;
        }
        for (const at of [lo, hi, Math.floor(hi / 86_400_000) * 86_400_000 + 43_200_000]) {
          expect(isoInZone(new Date(at), zone), `${zone} ${at}`).toBe(viaIntl(at, zone));
        }
      }
      for (const at of [Date.UTC(2026, 5, 15, 9, 30), Date.UTC(2026, 11, 2, 23, 59, 59)]) {
        expect(isoInZone(new Date(at), zone), `${zone} ${at}`).toBe(viaIntl(at, zone));
      }
    }
    // Most of the world's summer-time zones change twice in 2026.
    expect(changes).toBeGreaterThan(100);
  });

  it("gives the offsets on both sides of a DST change in Toronto", () => {
    // [M] from memory: Canada's Eastern time moves to EDT at 02:00 on the second Sunday of March (2027-03-14):
    // 06:59:59Z is 01:59:59-05:00, 07:00:00Z is 03:00:00-04:00.
    expect(isoInZone(new Date("2027-03-14T06:59:59Z"), "America/Toronto")).toBe("2027-03-14T01:59:59-05:00");
    expect(isoInZone(new Date("2027-03-14T07:00:00Z"), "America/Toronto")).toBe("2027-03-14T03:00:00-04:00");
    // Midnight stays 00, not 24.
    expect(isoInZone(new Date("2027-06-01T04:00:00Z"), "America/Toronto")).toBe("2027-06-01T00:00:00-04:00");
  });
});
