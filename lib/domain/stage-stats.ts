// Estimated against actual stage minutes, per material, finishing mode and stage: the numbers a
// clinic manager uses to tune its stage durations. Pure.
import type { Mode, StageKey } from "./types";

export type DurationSample = {
  materialId: string;
  mode: Mode;
  stage: StageKey;
  plannedMinutes: number;
  actualMinutes: number;
};

export type DurationSummary = {
  materialId: string;
  mode: Mode;
  stage: StageKey;
  count: number;
  /** Median of the planned minutes of those visits (what was estimated). */
  estimatedMinutes: number;
  medianMinutes: number;
  /** Interquartile range, the middle half of the actual minutes. */
  q1Minutes: number;
  q3Minutes: number;
  minMinutes: number;
  maxMinutes: number;
};

/** Quantile by linear interpolation between closest ranks (p in [0, 1]) over sorted values. */
export function quantile(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) throw new Error("No values to take a quantile of.");
  if (p < 0 || p > 1) throw new Error("A quantile lies between 0 and 1.");
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.ceil(h);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

const round1 = (x: number) => Math.round(x * 10) / 10;

export function summariseDurations(samples: readonly DurationSample[], order: readonly StageKey[]): DurationSummary[] {
  const groups = new Map<string, DurationSample[]>();
  for (const s of samples) {
    if (!(s.actualMinutes >= 0) || !(s.plannedMinutes > 0)) continue;
    const k = `${s.materialId}|${s.mode}|${s.stage}`;
    groups.set(k, [...(groups.get(k) ?? []), s]);
  }
  const out: DurationSummary[] = [];
  for (const list of groups.values()) {
    const actual = list.map((s) => s.actualMinutes).sort((a, b) => a - b);
    const planned = list.map((s) => s.plannedMinutes).sort((a, b) => a - b);
    const { materialId, mode, stage } = list[0];
    out.push({
      materialId, mode, stage, count: list.length,
      estimatedMinutes: round1(quantile(planned, 0.5)),
      medianMinutes: round1(quantile(actual, 0.5)),
      q1Minutes: round1(quantile(actual, 0.25)),
      q3Minutes: round1(quantile(actual, 0.75)),
      minMinutes: round1(actual[0]),
      maxMinutes: round1(actual[actual.length - 1]),
    });
  }
  const rank = (s: StageKey) => order.indexOf(s);
  return out.sort((a, b) => a.materialId.localeCompare(b.materialId) || a.mode.localeCompare(b.mode) || rank(a.stage) - rank(b.stage));
}
