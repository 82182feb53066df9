// Patient details: phone numbers to E.164, real dates of birth, one schema for the form and the API.
import { getCountries, getExampleNumber, type CountryCode } from "libphonenumber-js";
import examples from "libphonenumber-js/mobile/examples";
import { describe, expect, it } from "vitest";
import { nameKey } from "@/lib/domain/consent-schemas";
import {
  birthDateProblem, displayPhone, invitationState, likeContains, localToday, registerPatientSchema, searchTerms, toE164, updateMeSchema,
} from "@/lib/domain/patient-record";

// [P] ITU-T Recommendation E.164 (11/2010), §6: an international number is at most 15 digits
// (country code + national significant number); written with a leading "+" it has no other characters.
const E164 = /^\+[1-9]\d{1,14}$/;

describe("phone numbers", () => {
  it("turns every published national example mobile number into E.164 and back to the same national form", () => {
    // [P] Example numbers published by libphonenumber-js (libphonenumber-js/mobile/examples), one per country.
    let checked = 0;
    for (const country of getCountries()) {
      const example = getExampleNumber(country, examples);
      if (!example) continue;
      const national = example.formatNational();
      const e164 = toE164(national, country as CountryCode);
      expect(e164, `${country} ${national}`).toBe(example.number);
      expect(e164).toMatch(E164);
      expect(displayPhone(e164, country as CountryCode)).toBe(national);
      checked++;
    }
    expect(checked).toBeGreaterThan(200);
  });

  it("reads Canadian numbers as reception types them", () => {
    // [M] 555-0100…0199 are set aside for fiction in North America; [P] STACK/libphonenumber: +1 613 555 0134 is valid (CA).
    for (const typed of ["613 555 0134", "(613) 555-0134", "+1 613-555-0134", "1 613 555 0134", "613.555.0134"]) {
      expect(toE164(typed, "CA"), typed).toBe("+16135550134");
    }
    expect(displayPhone("+16135550134", "CA")).toBe("(613) 555-0134");
    // Another country's number keeps its country code when shown in Canada.
    expect(displayPhone("+33612345678", "CA")).toBe("+33 6 12 34 56 78");
  });

  it("refuses numbers that cannot be real", () => {
    expect(toE164("+1 555 0134", "CA")).toBeNull(); // seven digits after +1: too short for the North American plan
    expect(toE164("12", "CA")).toBeNull();
    expect(toE164("+1 613 555 0134 99999", "CA")).toBeNull();
    expect(toE164("not a phone", "CA")).toBeNull();
    // [P] E.164 §6: 16 digits in all is one more than allowed.
    expect(toE164("+4930123456789012", "DE")).toBeNull();
  });
});

describe("dates of birth", () => {
  const today = "2026-12-02";
  it("accepts real dates up to today", () => {
    expect(birthDateProblem("1984-03-17", today)).toBeNull();
    expect(birthDateProblem("2024-02-29", today)).toBeNull(); // [P] Gregorian rule: 2024 is divisible by 4, not by 100 → leap year
    expect(birthDateProblem("2000-02-29", today)).toBeNull(); // [P] divisible by 400 → leap year
    expect(birthDateProblem(today, today)).toBeNull();
  });
  it("refuses dates the calendar does not have, the future and the implausibly old", () => {
    expect(birthDateProblem("2023-02-29", today)).toMatch(/does not exist/);
    expect(birthDateProblem("1900-02-29", today)).toMatch(/does not exist/); // [P] divisible by 100, not 400 → not a leap year
    expect(birthDateProblem("1990-04-31", today)).toMatch(/does not exist/);
    expect(birthDateProblem("1990-00-10", today)).toMatch(/does not exist/);
    expect(birthDateProblem("2026-12-03", today)).toMatch(/future/);
    expect(birthDateProblem("1890-01-01", today)).toMatch(/130 years/);
    expect(birthDateProblem("17/03/1984", today)).toMatch(/year-month-day/);
  });
  it("takes today in the clinic's zone", () => {
    // 03:30 UTC on 3 December is still 2 December in Toronto (UTC−5 in winter) [C].
    expect(localToday("America/Toronto", new Date("2026-12-03T03:30:00Z"))).toBe("2026-12-02");
    expect(localToday("Europe/Paris", new Date("2026-12-03T03:30:00Z"))).toBe("2026-12-03");
  });
});

describe("the registration schema", () => {
  const schema = registerPatientSchema({ country: "CA", today: "2026-12-02" });
  it("normalises what it accepts", () => {
    const out = schema.parse({ name: "  Zoë Halvorsen ", email: " Zoe@Example.TEST ", dateOfBirth: "1984-03-17", phone: "613 555 0178", address: "" });
    expect(out).toEqual({ name: "Zoë Halvorsen", email: "zoe@example.test", dateOfBirth: "1984-03-17", phone: "+16135550178", language: "en", reminders: true, address: undefined });
  });
  it("names the field of each problem", () => {
    const r = schema.safeParse({ name: "123", email: "x", dateOfBirth: "2030-01-01", phone: "555", language: "es" });
    expect(r.success).toBe(false);
    const fields = new Set(r.error!.issues.map((i) => i.path.join(".")));
    expect(fields).toEqual(new Set(["name", "email", "dateOfBirth", "phone", "language"]));
  });
  it("lets a patient change only their own preferences", () => {
    const me = updateMeSchema("CA");
    expect(me.parse({ phone: null, language: "fr" })).toEqual({ phone: null, language: "fr" });
    expect(me.safeParse({ dateOfBirth: "1990-01-01" }).success).toBe(false);
  });
});

describe("duplicate names and search terms", () => {
  it("folds names the way the consent screen does", () => {
    expect(nameKey("Zoë  Halvorsen-Ruiz")).toBe(nameKey("ZOE HALVORSEN RUIZ"));
    expect(nameKey("Bjørn Ødegård")).toBe(nameKey("bjorn odegard"));
    expect(nameKey("Ana Ruiz")).not.toBe(nameKey("Ana Ruis"));
  });
  it("splits a search into text, phone digits and a date, and escapes LIKE wildcards", () => {
    expect(searchTerms("  Zoë ")).toEqual({ text: "zoë", digits: null, date: null });
    expect(searchTerms("(613) 555-01")).toEqual({ text: "(613) 555-01", digits: "61355501", date: null });
    expect(searchTerms("1984-03-17").date).toBe("1984-03-17");
    expect(likeContains("50%_off\\")).toBe("%50\\%\\_off\\\\%");
  });
  it("tells staff where an invitation stands", () => {
    const at = new Date("2026-12-01T10:00:00Z");
    expect(invitationState({ lastInvitedAt: null, invitationExpiresAt: null, firstSignedInAt: null, lastSignedInAt: null }).state).toBe("not_invited");
    expect(invitationState({ lastInvitedAt: at, invitationExpiresAt: at, firstSignedInAt: null, lastSignedInAt: null }).state).toBe("invited");
    expect(invitationState({ lastInvitedAt: at, invitationExpiresAt: at, firstSignedInAt: at, lastSignedInAt: at }).state).toBe("signed_in");
  });
});
