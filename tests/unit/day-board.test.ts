// The day board's projection: late stages shift their visit, and through shared machines later visits.
import { describe, expect, it } from "vitest";
import { checkProgress, projectDay, type BoardDevice, type BoardVisitInput } from "@/lib/domain/day-board";
import { STAGE_ORDERS } from "@/db/seed/catalogue";
import { estimateTimeline, type StageMinuteRow } from "@/lib/domain/timeline";
import type { AppointmentStatus } from "@/lib/domain/types";

const MIN = 60_000;
const T0 = Date.UTC(2026, 4, 4, 13, 0); // 09:00 in Toronto
const at = (minutes: number) => T0 + minutes * MIN;

const ROWS: StageMinuteRow[] = [
  { stage: "check_in", toothClass: null, minutes: 5 },
  { stage: "anaesthesia", toothClass: null, minutes: 10 },
  { stage: "preparation", toothClass: null, minutes: 25 },
  { stage: "scan", toothClass: null, minutes: 10 },
  { stage: "design", toothClass: null, minutes: 15 },
  { stage: "try_in", toothClass: null, minutes: 10 },
  { stage: "cementation", toothClass: null, minutes: 15 },
  { stage: "aftercare", toothClass: null, minutes: 10 },
];
// Zirconia-like: 15 min milling, 20 min sintering, 10 min polish.
const TIMELINE = estimateTimeline({
  material: { fabrication: "dry_milling", heatTreatment: "sintering", stageOrder: STAGE_ORDERS.sintered },
  mode: { fabricationMinutes: 15, heatTreatmentMinutes: 20, finishing: "polish", finishingMinutes: 10 },
  toothClass: "molar",
  stageMinutes: ROWS,
});
const offset = (key: string) => TIMELINE.stages.find((s) => s.key === key)!;

const DEVICES: BoardDevice[] = [
  { id: "chair-1", kind: "chair", name: "Chair 1" },
  { id: "chair-2", kind: "chair", name: "Chair 2" },
  { id: "mill-a", kind: "mill", name: "Mill A" },
  { id: "mill-b", kind: "mill", name: "Mill B" },
  { id: "furnace-1", kind: "furnace", name: "Furnace 1" },
];

function visit(id: string, startMin: number, opts: Partial<{ chair: string; mill: string; furnace: string; dentist: string; status: AppointmentStatus }> = {}): BoardVisitInput {
  return {
    id,
    status: opts.status ?? "confirmed",
    dentistId: opts.dentist ?? `dentist-${id}`,
    devices: { chair: opts.chair ?? `chair-${id}`, mill: opts.mill ?? "mill-a", furnace: opts.furnace ?? "furnace-1" },
    stages: TIMELINE.stages.map((s) => ({
      key: s.key, equipment: s.equipment, plannedStart: at(startMin + s.startMin), plannedEnd: at(startMin + s.endMin), actualStart: null, actualEnd: null,
    })),
  };
}

/** Marks every stage up to and including `key` as done on plan, except `late` minutes added to the end of `key`. */
function doneThrough(v: BoardVisitInput, key: string, late = 0): BoardVisitInput {
  const last = v.stages.findIndex((s) => s.key === key);
  return {
    ...v,
    status: "in_progress",
    stages: v.stages.map((s, i) => (i < last ? { ...s, actualStart: s.plannedStart, actualEnd: s.plannedEnd } : i === last ? { ...s, actualStart: s.plannedStart, actualEnd: s.plannedEnd + late * MIN } : s)),
  };
}

const stageOf = (p: ReturnType<typeof projectDay>, visitId: string, key: string) => p.visits.find((v) => v.id === visitId)!.stages.find((s) => s.key === key)!;

describe("projectDay", () => {
  it("keeps the plan when nothing has happened yet", () => {
    const a = visit("a", 0);
    const b = visit("b", 60);
    const p = projectDay({ devices: DEVICES, outages: [], visits: [a, b] });
    expect(p.conflicts).toEqual([]);
    for (const v of p.visits) {
      expect(v.delayMinutes).toBe(0);
      for (const s of v.stages) expect([s.start, s.end, s.shiftMinutes, s.state]).toEqual([s.plannedStart, s.plannedEnd, 0, "planned"]);
    }
  });

  it("shifts the rest of a visit by the minutes a stage finished late", () => {
    const a = doneThrough(visit("a", 0), "preparation", 12);
    const p = projectDay({ devices: DEVICES, outages: [], visits: [a] });
    expect(stageOf(p, "a", "preparation")).toMatchObject({ state: "done", end: at(offset("preparation").endMin + 12) });
    expect(stageOf(p, "a", "scan").shiftMinutes).toBe(12);
    expect(stageOf(p, "a", "cementation").shiftMinutes).toBe(12);
    expect(p.visits[0].delayMinutes).toBe(12);
    expect(p.conflicts).toEqual([]);
  });

  it("makes the next visit on the same mill wait, flags it, and proposes the free mill", () => {
    const fab = offset("fabrication");
    // B's milling starts 5 minutes after A's planned milling ends.
    const bStart = fab.endMin + 5 - fab.startMin;
    const a = doneThrough(visit("a", 0), "fabrication", 20);
    const b = visit("b", bStart);
    const p = projectDay({ devices: DEVICES, outages: [], visits: [a, b] });

    const aMillEnd = at(fab.endMin + 20);
    const bMill = stageOf(p, "b", "fabrication");
    expect(bMill.start).toBe(aMillEnd);
    expect(bMill.shiftMinutes).toBe(15);
    expect(stageOf(p, "b", "heat_treatment").shiftMinutes).toBeGreaterThanOrEqual(15);
    expect(p.visits.find((v) => v.id === "b")!.delayMinutes).toBeGreaterThanOrEqual(15);
    // B's stages before milling are untouched: the knock-on starts at the shared mill.
    expect(stageOf(p, "b", "design").shiftMinutes).toBe(0);

    const mill = p.conflicts.find((c) => c.visitId === "b" && c.stageKey === "fabrication")!;
    expect(mill).toMatchObject({
      resourceKind: "mill", resourceId: "mill-a", blockedBy: { type: "visit", visitId: "a", stageKey: "fabrication" },
      wantedStart: bMill.plannedStart, laterStart: aMillEnd, switchTo: { deviceId: "mill-b", start: bMill.plannedStart },
    });
  });

  it("proposes only the later start when no other mill is free in time", () => {
    const fab = offset("fabrication");
    const a = doneThrough(visit("a", 0), "fabrication", 20);
    const b = visit("b", fab.endMin + 5 - fab.startMin);
    // C occupies Mill B across B's wanted window.
    const c = { ...visit("c", 0, { mill: "mill-b" }) };
    c.stages = c.stages.map((s) => (s.key === "fabrication" ? { ...s, plannedStart: at(fab.endMin), plannedEnd: at(fab.endMin + 40) } : s));
    const p = projectDay({ devices: DEVICES, outages: [], visits: [a, b, c] });
    const conflict = p.conflicts.find((x) => x.visitId === "b")!;
    expect(conflict.laterStart).toBe(at(fab.endMin + 20));
    expect(conflict.switchTo).toBeNull();
  });

  it("cascades: a third visit waits behind the second on the furnace", () => {
    const fab = offset("fabrication");
    const heat = offset("heat_treatment");
    const a = doneThrough(visit("a", 0), "fabrication", 30);
    const b = visit("b", 20, { mill: "mill-b" });
    // B sinters from 20+heat.start; push A's sintering into B's furnace window.
    const p = projectDay({ devices: DEVICES, outages: [], visits: [a, b] });
    const aHeat = stageOf(p, "a", "heat_treatment");
    expect(aHeat.start).toBe(at(fab.endMin + 30));
    const bHeat = stageOf(p, "b", "heat_treatment");
    // A already held the furnace in the plan before B, so B waits for A's shifted firing.
    expect(bHeat.plannedStart).toBe(at(20 + heat.startMin));
    expect(bHeat.start).toBe(aHeat.end);
    expect(p.conflicts.map((x) => [x.visitId, x.stageKey, x.resourceKind])).toContainEqual(["b", "heat_treatment", "furnace"]);
  });

  it("keeps later-planned visits waiting behind a stage that runs over, using the present", () => {
    const fab = offset("fabrication");
    const a = doneThrough(visit("a", 0), "design");
    a.stages = a.stages.map((s) => (s.key === "fabrication" ? { ...s, actualStart: s.plannedStart } : s));
    const now = at(fab.endMin + 25);
    // B mills right after A's planned milling and fires in a second furnace.
    const b = visit("b", fab.endMin - fab.startMin, { furnace: "furnace-2" });
    const p = projectDay({ devices: DEVICES, outages: [], visits: [a, b], now });
    expect(stageOf(p, "a", "fabrication")).toMatchObject({ state: "running", end: now });
    expect(stageOf(p, "b", "fabrication").start).toBe(now);
    // Without the present the running stage is assumed to take its planned time.
    const q = projectDay({ devices: DEVICES, outages: [], visits: [a, b] });
    expect(stageOf(q, "a", "fabrication").end).toBe(at(fab.endMin));
    expect(q.conflicts).toEqual([]);
  });

  it("starts a begun visit's next stage no earlier than now", () => {
    const a = doneThrough(visit("a", 0), "check_in");
    const now = at(30);
    const p = projectDay({ devices: DEVICES, outages: [], visits: [a], now });
    expect(stageOf(p, "a", "anaesthesia").start).toBe(now);
  });

  it("lets a visit that finished a stage early go on, without flagging anything", () => {
    const a = doneThrough(visit("a", 0), "scan", -5);
    const p = projectDay({ devices: DEVICES, outages: [], visits: [a, visit("b", 90)] });
    expect(stageOf(p, "a", "design").shiftMinutes).toBe(-5);
    expect(p.visits[0].delayMinutes).toBe(-5);
    expect(p.conflicts).toEqual([]);
  });

  it("treats an out-of-service range as busy and proposes the other machine", () => {
    const fab = offset("fabrication");
    const a = visit("a", 0);
    const outage = { equipmentId: "mill-a", start: at(fab.startMin - 10), end: at(fab.startMin + 30) };
    const p = projectDay({ devices: DEVICES, outages: [outage], visits: [a] });
    expect(stageOf(p, "a", "fabrication").start).toBe(outage.end);
    expect(p.conflicts).toEqual([
      expect.objectContaining({ visitId: "a", stageKey: "fabrication", blockedBy: { type: "outage" }, switchTo: { deviceId: "mill-b", start: at(fab.startMin) } }),
    ]);
  });

  it("passes a shared dentist's delay on to the next patient", () => {
    const a = doneThrough(visit("a", 0, { dentist: "dr", chair: "chair-1" }), "design", 10);
    // B's preparation was planned while A's crown is being milled (the dentist is free then).
    const b = visit("b", offset("fabrication").startMin - offset("anaesthesia").startMin, { dentist: "dr", chair: "chair-2" });
    const p = projectDay({ devices: DEVICES, outages: [], visits: [a, b] });
    expect(stageOf(p, "b", "anaesthesia").shiftMinutes).toBe(10);
    expect(p.conflicts).toContainEqual(expect.objectContaining({ visitId: "b", stageKey: "anaesthesia", resourceKind: "dentist", switchTo: null }));
  });

  it("holds the chair's cleaning buffer after a visit", () => {
    const a = doneThrough(visit("a", 0, { chair: "chair-1" }), "cementation", 0);
    a.status = "completed";
    const b = visit("b", offset("cementation").endMin, { chair: "chair-1", mill: "mill-b" });
    const p = projectDay({ devices: DEVICES, outages: [], visits: [a, b], bufferMinutes: 10 });
    expect(stageOf(p, "b", "check_in").shiftMinutes).toBe(10);
  });

  it("leaves out cancelled, declined and no-show visits", () => {
    const a = { ...doneThrough(visit("a", 0), "fabrication", 60), status: "cancelled" as const };
    const p = projectDay({ devices: DEVICES, outages: [], visits: [a, visit("b", 20)] });
    expect(p.visits.map((v) => v.id)).toEqual(["b"]);
    expect(p.conflicts).toEqual([]);
  });
});

describe("checkProgress", () => {
  const stages = TIMELINE.stages.map((s) => ({ key: s.key, actualStart: null as number | null, actualEnd: null as number | null }));
  const withDone = (n: number) => stages.map((s, i) => (i < n ? { ...s, actualStart: at(i), actualEnd: at(i + 1) } : s));

  it("moves the visit through checked-in, in progress and completed", () => {
    expect(checkProgress({ status: "confirmed", stages, key: "check_in", action: "start", at: at(0) })).toEqual({ ok: true, statusAfter: "checked_in" });
    expect(checkProgress({ status: "checked_in", stages: withDone(1), key: "anaesthesia", action: "start", at: at(2) })).toEqual({ ok: true, statusAfter: "in_progress" });
    expect(checkProgress({ status: "in_progress", stages: withDone(2), key: "preparation", action: "start", at: at(3) })).toEqual({ ok: true, statusAfter: null });
    const ready = withDone(9).map((s) => (s.key === "cementation" ? { ...s, actualStart: at(20), actualEnd: null } : s));
    expect(checkProgress({ status: "in_progress", stages: ready, key: "cementation", action: "finish", at: at(30) })).toEqual({ ok: true, statusAfter: "completed" });
  });

  it("refuses finishing a stage that was not started", () => {
    expect(checkProgress({ status: "in_progress", stages: withDone(2), key: "preparation", action: "finish", at: at(5) }))
      .toMatchObject({ ok: false, status: 409, message: expect.stringMatching(/has not started/) });
  });

  it("refuses marking stages on a cancelled, declined, requested or completed visit", () => {
    for (const status of ["cancelled", "declined", "requested", "completed", "no_show"] as const) {
      expect(checkProgress({ status, stages, key: "check_in", action: "start", at: at(0) })).toMatchObject({ ok: false, status: 409 });
    }
  });

  it("keeps the stages in order and times that make sense", () => {
    expect(checkProgress({ status: "confirmed", stages, key: "scan", action: "start", at: at(0) })).toMatchObject({ ok: false, message: expect.stringMatching(/^Finish/) });
    expect(checkProgress({ status: "checked_in", stages: withDone(1), key: "anaesthesia", action: "start", at: at(0) })).toMatchObject({ ok: false, status: 422 });
    const running = withDone(2).map((s) => (s.key === "preparation" ? { ...s, actualStart: at(10) } : s));
    expect(checkProgress({ status: "in_progress", stages: running, key: "preparation", action: "finish", at: at(9) })).toMatchObject({ ok: false, status: 422 });
    expect(checkProgress({ status: "in_progress", stages: running, key: "preparation", action: "start", at: at(11) })).toMatchObject({ ok: false, status: 409 });
    expect(checkProgress({ status: "in_progress", stages, key: "aftercare", action: "start", at: at(0) })).toMatchObject({ ok: false, status: 404 });
  });
});
