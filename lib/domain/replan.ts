// Live re-planning of one visit: from its planned stages and what has really happened so far, the
// windows each resource should now be held for. Started stages keep their real times; the rest
// follow on without gaps, as long as they were planned. Pure; times in epoch ms.
import type { ResourceKind, StageKey } from "./types";

export type ReplanStage = {
  key: StageKey;
  plannedStart: number;
  plannedEnd: number;
  actualStart: number | null;
  actualEnd: number | null;
  equipment: readonly ResourceKind[];
};

export type HoldWindow = { stage: StageKey; kind: ResourceKind; start: number; end: number };

const MIN = 60_000;

/** The stages' expected times now: real where known, planned lengths chained after them otherwise. */
export function expectedStages(stages: ReplanStage[]): { key: StageKey; start: number; end: number }[] {
  let cursor = stages[0]?.plannedStart ?? 0;
  return stages.map((s) => {
    const length = s.plannedEnd - s.plannedStart;
    const start = s.actualStart ?? cursor;
    const end = s.actualEnd ?? start + length;
    cursor = end;
    return { key: s.key, start, end };
  });
}

/** The windows the visit should hold now; the chair keeps its cleaning buffer after its last stage. */
export function expectedHolds(stages: ReplanStage[], bufferMinutes: number): HoldWindow[] {
  const times = expectedStages(stages);
  const lastChair = stages.reduce((last, s, i) => (s.equipment.includes("chair") ? i : last), -1);
  return stages.flatMap((s, i) =>
    s.equipment.map((kind) => ({
      stage: s.key,
      kind,
      start: times[i].start,
      end: times[i].end + (kind === "chair" && i === lastChair ? bufferMinutes * MIN : 0),
    })),
  );
}

export type HeldWindow = { id: string | number; stage: string; kind: ResourceKind; start: number; end: number };
export type Move = { id: string | number; stage: string; kind: ResourceKind; from: { start: number; end: number }; to: { start: number; end: number } };

/** The reservations that must change, in an order that never makes the visit overlap itself on
 *  one resource: holds moving later go first from the last, then holds moving earlier from the first. */
export function movesFor(held: HeldWindow[], wanted: HoldWindow[]): Move[] {
  const moves: Move[] = [];
  for (const h of held) {
    const w = wanted.find((x) => x.stage === h.stage && x.kind === h.kind);
    if (!w || (w.start === h.start && w.end === h.end)) continue;
    moves.push({ id: h.id, stage: h.stage, kind: h.kind, from: { start: h.start, end: h.end }, to: { start: w.start, end: w.end } });
  }
  const later = moves.filter((m) => m.to.start > m.from.start || (m.to.start === m.from.start && m.to.end > m.from.end)).sort((a, b) => b.from.start - a.from.start);
  const earlier = moves.filter((m) => !later.includes(m)).sort((a, b) => a.from.start - b.from.start);
  return [...later, ...earlier];
}
