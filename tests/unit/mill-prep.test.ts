import { describe, expect, it } from "vitest";
import { millPrepList, type PrepVisit } from "@/lib/domain/mill-prep";
import { isVitaShade, VITA_CLASSICAL_SHADES } from "@/lib/domain/shades";

const MIN = 60_000;
const visit = (id: string, millId: string, fabStart: number, over: Partial<PrepVisit> = {}): PrepVisit => ({
  id, initials: "AB", tooth: 36, material: "Zirconia", shade: "A2", blockSize: "14", millId,
  fabricationStart: fabStart * MIN, fabricationEnd: (fabStart + 12) * MIN, fabricationDone: false, loadedAt: null, lots: [], ...over,
});

describe("VITA classical shades", () => {
  // [P] VITA classical shade guide: 16 shades A1, A2, A3, A3.5, A4, B1–B4, C1–C4, D2–D4.
  it("are exactly the guide's 16 shades", () => {
    expect([...VITA_CLASSICAL_SHADES]).toEqual(["A1", "A2", "A3", "A3.5", "A4", "B1", "B2", "B3", "B4", "C1", "C2", "C3", "C4", "D2", "D3", "D4"]);
    expect(new Set(VITA_CLASSICAL_SHADES).size).toBe(16);
  });

  it("refuses shades the guide does not have", () => {
    for (const s of ["A3.5", "D2", "B4"]) expect(isVitaShade(s)).toBe(true);
    // No D1, no A5, no B3.5 on the classical guide; lower case is not its notation.
    for (const s of ["D1", "A5", "B3.5", "a2", "0M1", ""]) expect(isVitaShade(s)).toBe(false);
  });
});

describe("mill preparation list", () => {
  it("orders each mill's blocks by fabrication and gives each a load window after the previous crown", () => {
    const list = millPrepList([visit("b", "m1", 200), visit("a", "m1", 100), visit("c", "m2", 150)], 0);
    expect(list.get("m1")!.map((i) => [i.id, i.loadFrom === null ? null : i.loadFrom / MIN, i.loadBy / MIN])).toEqual([["a", null, 100], ["b", 112, 200]]);
    expect(list.get("m2")!.map((i) => i.id)).toEqual(["c"]);
  });

  it("says what is loaded, due, late or already cut, and what the dentist has not recorded", () => {
    const list = millPrepList([
      visit("loaded", "m1", 100, { loadedAt: 90 * MIN }),
      visit("late", "m1", 130, { shade: null }),
      visit("cut", "m1", 60, { fabricationDone: true }),
      visit("due", "m1", 300, { blockSize: null }),
    ], 140 * MIN);
    expect(list.get("m1")!.map((i) => [i.id, i.state, i.missing])).toEqual([
      ["cut", "cut", []], ["loaded", "loaded", []], ["late", "late", ["shade"]], ["due", "due", ["block size"]],
    ]);
  });
});
