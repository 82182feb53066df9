// GS1 check digits and element strings, checked against GS1's published worked examples.
import { describe, expect, it } from "vitest";
import {
  GROUP_SEPARATOR, Gs1Error, gs1CheckDigit, gs1Date, isExpired, isValidGtin, normaliseLot, parseElementString, readBlockCode,
} from "@/lib/domain/gs1";

const GS = GROUP_SEPARATOR;
const TODAY = "2026-05-04";

/** Luhn (mod 10, doubling every second digit from the right): written here only to show GS1 differs from it. */
function luhnCheckDigit(data: string): number {
  let sum = 0;
  for (let i = 0; i < data.length; i++) {
    let d = Number(data[data.length - 1 - i]);
    if (i % 2 === 0) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return (10 - (sum % 10)) % 10;
}

function errorOf(fn: () => unknown): Gs1Error {
  try {
    fn();
  } catch (err) {
    if (err instanceof Gs1Error) return err;
    throw err;
  }
  throw new Error("expected a Gs1Error");
}

describe("GS1 check digit", () => {
  // [P] GS1 General Specifications, check digit calculation: weights 3,1,3,… from the rightmost
  // data digit; check = (10 − sum mod 10) mod 10. Worked examples as published by GS1 member offices.
  it.each([
    ["890400021003", 7], // [P] GS1 India worked example
    ["629104150021", 3], // [P] GS1 Hong Kong worked example
    ["730001100001", 7], // [P] GS1 Sweden worked example
  ])("%s → %i", (data, check) => {
    expect(gs1CheckDigit(data)).toBe(check);
    expect(isValidGtin(`${data}${check}`)).toBe(true);
    expect(isValidGtin(`0${data}${check}`)).toBe(true); // the same GTIN-13 padded to 14 digits keeps its check digit
    expect(isValidGtin(`${data}${(check + 1) % 10}`)).toBe(false);
  });

  it("is not the Luhn algorithm: the two differ on GS1's own examples", () => {
    // [P] GS1 India: 890400021003 → 7; Luhn gives 4 for the same digits.
    expect(luhnCheckDigit("890400021003")).toBe(4);
    expect(gs1CheckDigit("890400021003")).toBe(7);
    // [P] GS1 Hong Kong: 629104150021 → 3; Luhn gives 5.
    expect(luhnCheckDigit("629104150021")).toBe(5);
    expect(gs1CheckDigit("629104150021")).toBe(3);
    // A GTIN made valid under Luhn is refused.
    expect(isValidGtin("08904000210034")).toBe(false);
  });

  it("refuses non-digits and wrong lengths", () => {
    expect(() => gs1CheckDigit("12a4")).toThrow(Gs1Error);
    expect(isValidGtin("890400021003")).toBe(false); // 12 digits without the check digit is not a GTIN-13
    expect(isValidGtin("123456789012345")).toBe(false);
  });
});

describe("GS1 dates (17) and (11)", () => {
  it("reads YYMMDD as YYYY-MM-DD", () => {
    // [P] GS1 General Specifications AI table: (17) expiry date YYMMDD; [P] 21 CFR 801.18 writes it YYYY-MM-DD.
    expect(gs1Date("271231", TODAY)).toBe("2027-12-31");
  });

  it("takes DD = 00 as the last day of the month", () => {
    // [M] from memory: GS1 General Specifications, a day of 00 means the end of the month.
    expect(gs1Date("270200", TODAY)).toBe("2027-02-28");
    expect(gs1Date("280200", TODAY)).toBe("2028-02-29");
    expect(gs1Date("270400", TODAY)).toBe("2027-04-30");
  });

  it("chooses the century within GS1's sliding window", () => {
    // [M] from memory: GS1 General Specifications, century of a YY: up to 50 years ahead counts as this century, further as the last.
    expect(gs1Date("750101", TODAY)).toBe("2075-01-01");
    expect(gs1Date("770101", TODAY)).toBe("1977-01-01");
    expect(gs1Date("990101", "2075-06-01")).toBe("2099-01-01");
    expect(gs1Date("050101", "2080-06-01")).toBe("2105-01-01");
  });

  it("refuses impossible dates", () => {
    expect(() => gs1Date("271301", TODAY)).toThrow(/no month 13/);
    expect(() => gs1Date("270230", TODAY)).toThrow(/does not exist/);
    expect(() => gs1Date("2712", TODAY)).toThrow(/six digits/);
  });
});

describe("GS1 element strings", () => {
  // [M] from memory: 09501101530003 is GS1's example GTIN; its check digit 3 follows the published rule above.
  const GTIN = "09501101530003";

  it("parses the printed form with brackets, in any order", () => {
    expect(parseElementString(`(01)${GTIN}(17)271231(10)ZR-2207A(21)000451`, TODAY)).toEqual({
      gtin: GTIN, expiry: "2027-12-31", lot: "ZR-2207A", serial: "000451",
    });
    expect(parseElementString(` (01) ${GTIN} (10) L12 (17) 270500`, TODAY)).toEqual({ gtin: GTIN, lot: "L12", expiry: "2027-05-31" });
  });

  it("parses the scanned form with GS as FNC1, and a variable-length field ending at the string's end", () => {
    // [P] GS1 General Specifications: (10) and (21) are variable length up to 20 and FNC1-terminated unless last.
    expect(parseElementString(`01${GTIN}17271231` + `10ZR-2207A${GS}21000451`, TODAY)).toEqual({
      gtin: GTIN, expiry: "2027-12-31", lot: "ZR-2207A", serial: "000451",
    });
    expect(parseElementString(`01${GTIN}10ZR-2207A`, TODAY)).toEqual({ gtin: GTIN, lot: "ZR-2207A" });
  });

  it("accepts a symbology identifier and a leading FNC1 from a scanner", () => {
    expect(parseElementString(`]d2${GS}01${GTIN}17271231` + `10ABC`, TODAY)).toEqual({ gtin: GTIN, expiry: "2027-12-31", lot: "ABC" });
  });

  it("refuses a GTIN with a wrong check digit, naming the expected digit", () => {
    const err = errorOf(() => parseElementString(`(01)09501101530004(10)A1`, TODAY));
    expect(err.code).toBe("check_digit");
    expect(err.message).toMatch(/check digit \(expected 3\)/);
  });

  it("refuses a lot or serial longer than 20 characters (a missing separator)", () => {
    // [P] GS1 General Specifications: (10) and (21) at most 20 characters.
    expect(parseElementString(`(10)${"A".repeat(20)}`, TODAY).lot).toHaveLength(20);
    expect(errorOf(() => parseElementString(`(10)${"A".repeat(21)}`, TODAY)).message).toMatch(/longer than 20/);
    // Without the separator the serial runs into the lot; past 20 characters that is caught.
    expect(errorOf(() => parseElementString(`10${"B".repeat(15)}21${"C".repeat(10)}`, TODAY)).message).toMatch(/longer than 20/);
  });

  it("refuses malformed strings with a clear message", () => {
    expect(errorOf(() => parseElementString("", TODAY)).message).toMatch(/Scan or type/);
    expect(errorOf(() => parseElementString("hello", TODAY)).code).toBe("malformed");
    expect(errorOf(() => parseElementString(`(01)0950110153000`, TODAY)).message).toMatch(/exactly 14 digits/);
    expect(errorOf(() => parseElementString(`(10)A1(10)B2`, TODAY)).message).toMatch(/twice/);
    expect(errorOf(() => parseElementString(`(10)A B`.replace(" ", "\u00e9"), TODAY)).message).toMatch(/character/);
    expect(errorOf(() => parseElementString(`30123${GS}10A`, TODAY)).code).toBe("unsupported");
    expect(errorOf(() => readBlockCode(`(01)${GTIN}(17)271231`, TODAY)).code).toBe("no_lot");
  });

  it("skips AIs it does not read in the printed form, where their end is visible", () => {
    expect(parseElementString(`(01)${GTIN}(240)SHADE-A2(10)L7`, TODAY)).toEqual({ gtin: GTIN, lot: "L7" });
  });
});

describe("recording a block", () => {
  it("refuses an expired block with its date, and accepts one on its last day", () => {
    const err = errorOf(() => readBlockCode(`(01)09501101530003(17)260503(10)OLD1`, TODAY));
    expect(err.code).toBe("expired");
    expect(err.message).toContain("2026-05-03");
    expect(readBlockCode(`(01)09501101530003(17)260504(10)EDGE1`, TODAY)).toMatchObject({ lot: "EDGE1", expiry: "2026-05-04" });
    // DD = 00: the block is good until the end of its month.
    expect(readBlockCode(`(17)260500(10)MONTH1`, "2026-05-31").expiry).toBe("2026-05-31");
    expect(isExpired("2026-05-31", "2026-06-01")).toBe(true);
  });

  it("normalises a lot typed by hand", () => {
    expect(normaliseLot("  ZR-2207A ")).toBe("ZR-2207A");
    expect(() => normaliseLot("")).toThrow(/Type the lot/);
    expect(() => normaliseLot("X".repeat(21))).toThrow(/20 characters/);
    expect(() => normaliseLot("AB 12")).toThrow(/without spaces/);
  });
});
