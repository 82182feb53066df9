// Estimated against actual stage minutes: median and spread per material, mode and stage.
import { describe, expect, it } from "vitest";
import { quantile, summariseDurations, type DurationSample } from "@/lib/domain/stage-stats";
import { STAGE_KEYS } from "@/lib/domain/types";

describe("quantile", () => {
  it("interpolates between closest ranks", () => {
    // [M] from memory: Hyndman & Fan (1996) definition 7, the default of R's quantile() and NumPy's percentile().
    expect(quantile([1, 2, 3, 4], 0.5)).toBe(2.5);
    expect(quantile([1, 2, 3, 4], 0.25)).toBe(1.75);
    expect(quantile([7, 15, 36, 39, 40, 41], 0.25)).toBeCloseTo(20.25, 10);
    expect(quantile([7, 15, 36, 39, 40, 41], 0.5)).toBe(37.5);
    expect(quantile([7, 15, 36, 39, 40, 41], 0.75)).toBeCloseTo(39.75, 10);
    expect(quantile([5], 0.9)).toBe(5);
  });

  it("refuses an empty list and a p outside [0, 1]", () => {
    expect(() => quantile([], 0.5)).toThrow();
    expect(() => quantile([1], 1.5)).toThrow();
  });
});

describe("summariseDurations", () => {
  const sample = (stage: DurationSample["stage"], mode: DurationSample["mode"], plannedMinutes: number, actualMinutes: number): DurationSample =>
    ({ materialId: "zr", mode, stage, plannedMinutes, actualMinutes });

  it("groups by material, mode and stage, in visit order", () => {
    const rows = summariseDurations(
      [
        sample("heat_treatment", "rapid", 20, 24), sample("fabrication", "rapid", 5, 6), sample("fabrication", "rapid", 5, 9),
        sample("fabrication", "rapid", 5, 7), sample("fabrication", "standard", 12, 12),
      ],
      STAGE_KEYS,
    );
    expect(rows.map((r) => [r.mode, r.stage, r.count])).toEqual([["rapid", "fabrication", 3], ["rapid", "heat_treatment", 1], ["standard", "fabrication", 1]]);
    expect(rows[0]).toMatchObject({ estimatedMinutes: 5, medianMinutes: 7, q1Minutes: 6.5, q3Minutes: 8, minMinutes: 6, maxMinutes: 9 });
  });

  it("skips samples that cannot be durations", () => {
    expect(summariseDurations([sample("scan", "rapid", 10, -1), sample("scan", "rapid", 0, 5)], STAGE_KEYS)).toEqual([]);
  });
});
