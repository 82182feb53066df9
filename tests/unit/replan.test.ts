import { describe, expect, it } from "vitest";
import { expectedHolds, expectedStages, movesFor, type ReplanStage } from "@/lib/domain/replan";

const MIN = 60_000;
const stage = (key: ReplanStage["key"], start: number, end: number, equipment: ReplanStage["equipment"], actual: [number | null, number | null] = [null, null]): ReplanStage =>
  ({ key, plannedStart: start * MIN, plannedEnd: end * MIN, actualStart: actual[0] === null ? null : actual[0] * MIN, actualEnd: actual[1] === null ? null : actual[1] * MIN, equipment });

describe("re-planning one visit", () => {
  const plan = [
    stage("design", 0, 15, ["chair", "dentist"]),
    stage("fabrication", 15, 27, ["chair", "mill"]),
    stage("try_in", 27, 37, ["chair", "dentist"]),
    stage("cementation", 37, 52, ["chair", "dentist"]),
    stage("aftercare", 52, 62, []),
  ];

  it("keeps the plan while nothing has happened", () => {
    expect(expectedStages(plan).map((s) => [s.start / MIN, s.end / MIN])).toEqual([[0, 15], [15, 27], [27, 37], [37, 52], [52, 62]]);
  });

  it("chains the rest after a late end and pulls it forward after an early one", () => {
    const late = plan.map((s) => (s.key === "design" ? { ...s, actualStart: 0, actualEnd: 15 * MIN } : s.key === "fabrication" ? { ...s, actualStart: 15 * MIN, actualEnd: 47 * MIN } : s));
    expect(expectedStages(late).map((s) => [s.key, s.start / MIN, s.end / MIN])).toEqual([["design", 0, 15], ["fabrication", 15, 47], ["try_in", 47, 57], ["cementation", 57, 72], ["aftercare", 72, 82]]);
    const early = plan.map((s) => (s.key === "design" ? { ...s, actualStart: 0, actualEnd: 10 * MIN } : s));
    expect(expectedStages(early)[1]).toEqual({ key: "fabrication", start: 10 * MIN, end: 22 * MIN });
  });

  it("a running stage keeps its planned length from its real start", () => {
    const running = plan.map((s) => (s.key === "design" ? { ...s, actualStart: 5 * MIN } : s));
    expect(expectedStages(running).slice(0, 2).map((s) => [s.start / MIN, s.end / MIN])).toEqual([[5, 20], [20, 32]]);
  });

  it("keeps the chair's cleaning buffer after the last chair stage only", () => {
    const chair = expectedHolds(plan, 10).filter((h) => h.kind === "chair");
    expect(chair.map((h) => [h.stage, h.start / MIN, h.end / MIN])).toEqual([["design", 0, 15], ["fabrication", 15, 27], ["try_in", 27, 37], ["cementation", 37, 62]]);
  });

  it("moves later holds from the last backwards and earlier holds from the first, so a visit never overlaps itself", () => {
    const held = expectedHolds(plan, 0).map((h, i) => ({ id: i, ...h }));
    const shifted = expectedHolds(plan.map((s) => ({ ...s, plannedStart: s.plannedStart + (s.key === "design" ? 0 : 20 * MIN), plannedEnd: s.plannedEnd + 20 * MIN })), 0);
    const moves = movesFor(held, shifted);
    const chairOrder = moves.filter((m) => m.kind === "chair").map((m) => m.stage);
    expect(chairOrder).toEqual(["cementation", "try_in", "fabrication", "design"]);
    // Applying the moves one by one never makes two chair holds overlap.
    const chair = new Map(held.filter((h) => h.kind === "chair").map((h) => [h.id, { start: h.start, end: h.end }]));
    for (const m of moves.filter((x) => x.kind === "chair")) {
      chair.set(m.id as number, m.to);
      const list = [...chair.values()].sort((a, b) => a.start - b.start);
      for (let i = 1; i < list.length; i++) expect(list[i].start).toBeGreaterThanOrEqual(list[i - 1].end);
    }
    expect(movesFor(held, expectedHolds(plan, 0))).toEqual([]);
  });
});
