import { describe, expect, it } from "vitest";
import { describeTooth, fromFdi, fromUniversal, parseTooth, ToothError } from "@/lib/domain/tooth";

describe("tooth notation", () => {
  // [P] HL7 Dental Data Exchange implementation guide, appendix D1 crosswalk (FDI ↔ Universal): worked pairs.
  it.each([
    [18, "1"], [11, "8"], [21, "9"], [36, "19"], [46, "30"], [48, "32"], [55, "A"], [85, "T"],
  ])("FDI %i is Universal %s and back", (fdi, universal) => {
    expect(fromFdi(fdi).universal).toBe(universal);
    expect(fromUniversal(universal).fdi).toBe(fdi);
  });

  // [P] ISO 3950: quadrants 1 upper right, 2 upper left, 3 lower left, 4 lower right; teeth 1–8 from central incisor to third molar.
  it("names teeth in plain words from the quadrant and position", () => {
    expect(fromFdi(36).words).toBe("lower left first molar");
    expect(fromFdi(11).words).toBe("upper right central incisor");
    expect(fromFdi(24).words).toBe("upper left first premolar");
    expect(fromFdi(48).words).toBe("lower right third molar");
    expect(fromFdi(75).words).toBe("lower left primary second molar");
  });

  it("classifies anterior, premolar and molar teeth", () => {
    expect([11, 12, 13, 43].map((t) => fromFdi(t).toothClass)).toEqual(["anterior", "anterior", "anterior", "anterior"]);
    expect([14, 25, 34, 45].map((t) => fromFdi(t).toothClass)).toEqual(["premolar", "premolar", "premolar", "premolar"]);
    expect([16, 27, 38, 46, 54, 85].map((t) => fromFdi(t).toothClass)).toEqual(["molar", "molar", "molar", "molar", "molar", "molar"]);
  });

  it("round-trips every permanent and primary tooth through the Universal system", () => {
    const all = [1, 2, 3, 4].flatMap((q) => [1, 2, 3, 4, 5, 6, 7, 8].map((p) => q * 10 + p))
      .concat([5, 6, 7, 8].flatMap((q) => [1, 2, 3, 4, 5].map((p) => q * 10 + p)));
    const universals = new Set(all.map((fdi) => fromFdi(fdi).universal));
    expect(universals.size).toBe(52);
    for (const fdi of all) expect(fromUniversal(fromFdi(fdi).universal).fdi).toBe(fdi);
  });

  it("rejects codes that are not teeth, with a sentence", () => {
    for (const bad of ["19", "09", "49", "56", "90", "1", "abc", "", "366"]) expect(() => fromFdi(bad)).toThrow(ToothError);
    for (const bad of ["0", "33", "U", "1.5"]) expect(() => fromUniversal(bad)).toThrow(ToothError);
    expect(() => fromFdi(19)).toThrow(/not a tooth/);
  });

  // [P] REFERENCES.md trap: "11" is valid in both systems with different meanings.
  it("needs the system to read a bare number", () => {
    expect(parseTooth("11", "fdi").words).toBe("upper right central incisor");
    // [P] HL7 crosswalk: Universal 9 = FDI 21, counting on along the upper left, so Universal 11 = FDI 23.
    expect(parseTooth("11", "universal").fdi).toBe(23);
    expect(parseTooth("11", "universal").words).toBe("upper left canine");
  });

  it("builds a display label", () => {
    expect(describeTooth(36).label).toBe("36 (Universal 19) — lower left first molar");
  });
});
