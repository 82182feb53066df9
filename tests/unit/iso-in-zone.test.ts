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

  it("gives the offsets on both sides of a DST change in Toronto", () => {
    // [M] from memory: Canada's Eastern time moves to EDT at 02:00 on the second Sunday of March (2027-03-14):
    // 06:59:59Z is 01:59:59-05:00, 07:00:00Z is 03:00:00-04:00.
    expect(isoInZone(new Date("2027-03-14T06:59:59Z"), "America/Toronto")).toBe("2027-03-14T01:59:59-05:00");
    expect(isoInZone(new Date("2027-03-14T07:00:00Z"), "America/Toronto")).toBe("2027-03-14T03:00:00-04:00");
    // Midnight stays 00, not 24.
    expect(isoInZone(new Date("2027-06-01T04:00:00Z"), "America/Toronto")).toBe("2027-06-01T00:00:00-04:00");
  });
});
