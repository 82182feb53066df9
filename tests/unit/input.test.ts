// Ids and dates as the forms and the server read them: real calendar days only, checked against
// the Gregorian leap-year rule and against the platform's own calendar (Intl / Date.UTC).
import { describe, expect, it } from "vitest";
import { calendarDateSchema, idSchema, instantSchema, isCalendarDate, isInstant, localDateTimeSchema } from "@/lib/domain/input";

describe("calendar dates", () => {
  it("follows the Gregorian leap-year rule", () => {
    // [P] Gregorian calendar (Inter gravissimas, 1582): a year divisible by 4 is a leap year,
    // except centuries, which are leap years only when divisible by 400.
    expect(isCalendarDate("2028-02-29")).toBe(true);
    expect(isCalendarDate("2000-02-29")).toBe(true);
    expect(isCalendarDate("2100-02-29")).toBe(false);
    expect(isCalendarDate("2027-02-29")).toBe(false);
  });

  it("refuses impossible days and months instead of rolling them over", () => {
    for (const bad of ["2027-02-30", "2027-04-31", "2099-13-45", "2027-00-10", "2027-01-00", "27-01-01", "2027-1-1", "2027-01-01T00:00"]) {
      expect(isCalendarDate(bad), bad).toBe(false);
    }
  });

  it("agrees with the platform calendar on every day of a leap and a common year", () => {
    // [C] Date.UTC is the general-purpose reference here: it rolls an impossible day over, so a
    // day is real exactly when the date it builds reads back the same.
    for (const year of [2027, 2028]) {
      for (let month = 1; month <= 12; month++) {
        for (let day = 1; day <= 31; day++) {
          const text = `${year}-${String(month).padStart(2, "0")}-${String(day).padStart(2, "0")}`;
          const real = new Date(Date.UTC(year, month - 1, day)).toISOString().slice(0, 10) === text;
          expect(isCalendarDate(text), text).toBe(real);
        }
      }
    }
  });

  it("gives the field's own message", () => {
    const r = calendarDateSchema("from").safeParse("2027-02-30");
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].message).toBe("from must be a real date written YYYY-MM-DD, like 2027-03-15.");
  });
});

describe("instants and clinic-local times", () => {
  it("takes ISO 8601 with an offset, and refuses impossible parts", () => {
    // [P] ISO 8601 / RFC 3339 section 5.6: hours 00–23, minutes 00–59, offsets ±hh:mm.
    expect(isInstant("2027-03-15T08:00:00-04:00")).toBe(true);
    expect(isInstant("2027-03-15T08:00Z")).toBe(true);
    for (const bad of ["2027-02-30T08:00:00Z", "2027-03-15T24:00:00Z", "2027-03-15T08:60:00Z", "2027-03-15T08:00:00", "2027-03-15T08:00:00+25:00"]) {
      expect(isInstant(bad), bad).toBe(false);
    }
    expect(instantSchema().parse("2027-03-15T08:00:00-04:00").toISOString()).toBe("2027-03-15T12:00:00.000Z");
  });

  it("takes a datetime-local value only on a real day", () => {
    expect(localDateTimeSchema("start").safeParse("2027-03-15T08:00").success).toBe(true);
    expect(localDateTimeSchema("start").safeParse("2027-02-30T08:00").success).toBe(false);
    expect(localDateTimeSchema("start").safeParse("2027-03-15T25:00").success).toBe(false);
  });
});

describe("ids", () => {
  it("accepts UUIDs and refuses near-UUIDs", () => {
    expect(idSchema().safeParse("6d0c1a2b-0000-4000-8000-000000000000").success).toBe(true);
    for (const bad of ["-".repeat(36), "9".repeat(36), "6d0c1a2b-0000-4000-8000-00000000000g", "", "6d0c1a2b00004000800000000000000"]) {
      expect(idSchema().safeParse(bad).success, bad).toBe(false);
    }
    expect(idSchema("Patient").safeParse(undefined).error!.issues[0].message).toBe("Patient is required.");
  });
});
