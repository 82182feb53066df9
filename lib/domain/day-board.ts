// The live day board's arithmetic: from each visit's planned and actual stage times to a projected
// day, where late stages push the rest of their visit and, through a shared chair, mill, furnace
// or dentist, later visits; every push by another visit or an out-of-service range is a conflict
// with a proposal (another free machine of the same kind, or the later start). Pure; times in ms.
import { stageLabel } from "./timeline";
import type { AppointmentStatus, ResourceKind, StageKey } from "./types";

export type DeviceKind = Exclude<ResourceKind, "dentist">;
export type BoardDevice = { id: string; kind: DeviceKind; name: string };
export type BoardOutage = { equipmentId: string; start: number; end: number };

export type BoardStageInput = {
  key: StageKey;
  plannedStart: number;
  plannedEnd: number;
  actualStart: number | null;
  actualEnd: number | null;
  equipment: readonly ResourceKind[];
};

export type BoardVisitInput = {
  id: string;
  status: AppointmentStatus;
  dentistId: string;
  devices: { chair: string; mill: string; furnace: string | null };
  /** In visit order. */
  stages: BoardStageInput[];
};

export type StageState = "planned" | "running" | "done";

export type ProjectedStage = BoardStageInput & {
  start: number;
  end: number;
  state: StageState;
  /** Minutes between the projected and the planned start (negative when early). */
  shiftMinutes: number;
};

export type ProjectedVisit = {
  id: string;
  stages: ProjectedStage[];
  plannedEnd: number;
  projectedEnd: number;
  /** Minutes the visit's last stage ends after its plan (negative when early). */
  delayMinutes: number;
};

export type Blocker = { type: "visit"; visitId: string; stageKey: StageKey } | { type: "outage" };

export type Conflict = {
  visitId: string;
  stageKey: StageKey;
  resourceKind: ResourceKind;
  resourceId: string;
  blockedBy: Blocker;
  /** Where the stage wanted to start, and the later start it gets by waiting. */
  wantedStart: number;
  laterStart: number;
  /** A free machine of the same kind from `switchTo.start`, when that is earlier than waiting. */
  switchTo: { deviceId: string; start: number } | null;
};

export type DayProjection = { visits: ProjectedVisit[]; conflicts: Conflict[] };

export type ProjectInput = {
  devices: BoardDevice[];
  outages: BoardOutage[];
  visits: BoardVisitInput[];
  /** The present; stages running past their planned length end no earlier than now, and a begun visit's next stage starts no earlier than now. Leave out for days already over. */
  now?: number;
  /** Cleaning time a chair keeps after its visit's last chair stage. */
  bufferMinutes?: number;
};

const MIN = 60_000;

/** Visits in these states take part in the day. */
const ON_BOARD: readonly AppointmentStatus[] = ["requested", "confirmed", "checked_in", "in_progress", "completed"];

type Busy = { start: number; end: number; blocker: Blocker; visitId: string | null };

class Timetable {
  private readonly byResource = new Map<string, Busy[]>();

  add(resourceId: string, busy: Busy) {
    const list = this.byResource.get(resourceId) ?? [];
    list.push(busy);
    this.byResource.set(resourceId, list);
  }

  /** The first interval on the resource overlapping [start, end), other than the visit's own. */
  clash(resourceId: string, start: number, end: number, ownVisitId: string): Busy | undefined {
    return (this.byResource.get(resourceId) ?? [])
      .filter((b) => b.visitId !== ownVisitId && b.start < end && start < b.end)
      .sort((a, b) => a.start - b.start)[0];
  }

  /** Earliest start ≥ `from` where every window (offsets from the start) is free on its resource. */
  earliest(windows: { resourceId: string; offset: number; length: number }[], from: number, ownVisitId: string): { start: number; first?: Busy } {
    let start = from;
    let first: Busy | undefined;
    for (let guard = 0; guard < 1000; guard++) {
      let moved = false;
      for (const w of windows) {
        const hit = this.clash(w.resourceId, start + w.offset, start + w.offset + w.length, ownVisitId);
        if (hit) {
          first ??= hit;
          start = hit.end - w.offset;
          moved = true;
        }
      }
      if (!moved) return { start, first };
    }
    throw new Error("The day board could not place a stage: too many overlapping holds.");
  }
}

function resourceOf(visit: BoardVisitInput, kind: ResourceKind): string | null {
  return kind === "dentist" ? visit.dentistId : visit.devices[kind];
}

/** Projects the whole day: started stages are facts; the rest follow in planned order, waiting for busy resources. */
export function projectDay(input: ProjectInput): DayProjection {
  const buffer = (input.bufferMinutes ?? 0) * MIN;
  const visits = input.visits.filter((v) => ON_BOARD.includes(v.status));
  const table = new Timetable();
  for (const o of input.outages) table.add(o.equipmentId, { start: o.start, end: o.end, blocker: { type: "outage" }, visitId: null });

  const projected = new Map<string, ProjectedStage[]>();
  const lastChairIndex = new Map<string, number>();
  for (const v of visits) {
    projected.set(v.id, new Array(v.stages.length));
    lastChairIndex.set(v.id, v.stages.reduce((last, s, i) => (s.equipment.includes("chair") ? i : last), -1));
  }

  const hold = (v: BoardVisitInput, index: number, stage: ProjectedStage) => {
    for (const kind of stage.equipment) {
      const id = resourceOf(v, kind);
      if (!id) continue;
      const end = stage.end + (kind === "chair" && index === lastChairIndex.get(v.id) ? buffer : 0);
      table.add(id, { start: stage.start, end, blocker: { type: "visit", visitId: v.id, stageKey: stage.key }, visitId: v.id });
    }
  };

  // Started stages are what happened: they hold their resources first.
  for (const v of visits) {
    v.stages.forEach((s, i) => {
      if (s.actualStart === null) return;
      const planned = s.plannedEnd - s.plannedStart;
      const end = s.actualEnd ?? Math.max(s.actualStart + planned, input.now ?? -Infinity);
      const p: ProjectedStage = {
        ...s, start: s.actualStart, end, state: s.actualEnd === null ? "running" : "done",
        shiftMinutes: Math.round((s.actualStart - s.plannedStart) / MIN),
      };
      projected.get(v.id)![i] = p;
      hold(v, i, p);
    });
  }

  // The rest, in planned order, so a visit planned earlier on a resource keeps its turn.
  const pending = visits.flatMap((v) => v.stages.map((s, i) => ({ v, s, i })).filter(({ s }) => s.actualStart === null));
  pending.sort((a, b) => a.s.plannedStart - b.s.plannedStart || a.v.stages[0].plannedStart - b.v.stages[0].plannedStart || a.i - b.i);
  const conflicts: Conflict[] = [];

  for (const { v, s, i } of pending) {
    const length = s.plannedEnd - s.plannedStart;
    const prev = i > 0 ? projected.get(v.id)![i - 1] : undefined;
    const begun = v.stages.some((x) => x.actualStart !== null);
    let wanted: number;
    if (v.status === "completed") wanted = s.plannedStart;
    else if (begun && prev) wanted = Math.max(prev.end, input.now ?? -Infinity);
    else wanted = Math.max(s.plannedStart, prev?.end ?? -Infinity);

    const windows = s.equipment
      .map((kind) => ({ kind, resourceId: resourceOf(v, kind) }))
      .filter((w): w is { kind: ResourceKind; resourceId: string } => w.resourceId !== null)
      .map((w) => ({ ...w, offset: 0, length }));
    const { start, first } = v.status === "completed" ? { start: wanted, first: undefined } : table.earliest(windows, wanted, v.id);
    const p: ProjectedStage = { ...s, start, end: start + length, state: "planned", shiftMinutes: Math.round((start - s.plannedStart) / MIN) };
    projected.get(v.id)![i] = p;
    hold(v, i, p);

    // Waiting that still keeps the stage on its planned time (after an early finish) is no conflict.
    if (first && start > wanted && start > s.plannedStart) {
      const clashing = windows.find((w) => table.clash(w.resourceId, wanted, wanted + length, v.id) === first) ?? windows[0];
      conflicts.push({
        visitId: v.id, stageKey: s.key, resourceKind: clashing.kind, resourceId: clashing.resourceId,
        blockedBy: first.blocker, wantedStart: wanted, laterStart: start, switchTo: null,
      });
    }
  }

  // Proposals need the whole projected day, so they come last.
  for (const c of conflicts) {
    if (c.resourceKind === "dentist") continue;
    const v = visits.find((x) => x.id === c.visitId)!;
    c.switchTo = nearestFreeDevice(input.devices, table, v, projected.get(v.id)!, c);
  }

  const out: ProjectedVisit[] = visits.map((v) => {
    const stages = projected.get(v.id)!;
    const plannedEnd = Math.max(...v.stages.map((s) => s.plannedEnd));
    const projectedEnd = Math.max(...stages.map((s) => s.end));
    return { id: v.id, stages, plannedEnd, projectedEnd, delayMinutes: Math.round((projectedEnd - plannedEnd) / MIN) };
  });
  return { visits: out, conflicts };
}

/** Another machine of the conflicting kind, free for every remaining stage of the visit that uses
 *  that kind (moved back to the wanted start), from the earliest such start; null when waiting is as quick. */
function nearestFreeDevice(devices: BoardDevice[], table: Timetable, v: BoardVisitInput, stages: ProjectedStage[], c: Conflict) {
  const kind = c.resourceKind as DeviceKind;
  const from = stages.findIndex((s) => s.key === c.stageKey);
  const anchor = stages[from].start;
  const windows = stages
    .slice(from)
    .filter((s) => s.state === "planned" && s.equipment.includes(kind))
    .map((s) => ({ offset: s.start - anchor, length: s.end - s.start }));
  let best: { deviceId: string; start: number } | null = null;
  for (const d of devices) {
    if (d.kind !== kind || d.id === c.resourceId) continue;
    const { start } = table.earliest(windows.map((w) => ({ ...w, resourceId: d.id })), c.wantedStart, v.id);
    if (start < c.laterStart && (!best || start < best.start)) best = { deviceId: d.id, start };
  }
  return best;
}

/** Which stage staff may act on next, in visit order (aftercare is not tracked). */
export const TRACKED_STAGES: readonly StageKey[] = [
  "check_in", "anaesthesia", "preparation", "scan", "design", "fabrication", "heat_treatment", "finishing", "glaze_firing", "try_in", "cementation",
];

export type StageAction = "start" | "finish";

export type ProgressStage = { key: StageKey; actualStart: number | null; actualEnd: number | null };

export type ProgressCheck =
  | { ok: true; statusAfter: AppointmentStatus | null }
  | { ok: false; status: 404 | 409 | 422; message: string };

/** Whether `action` on stage `key` at time `at` is allowed, and the visit status it leads to.
 *  Starting check-in makes the visit checked in; starting the first clinical stage makes it in
 *  progress; finishing cementation completes it. */
export function checkProgress(input: {
  status: AppointmentStatus;
  stages: ProgressStage[];
  key: string;
  action: StageAction;
  at: number;
}): ProgressCheck {
  const { status, stages, key, action, at } = input;
  const tracked = stages.filter((s) => TRACKED_STAGES.includes(s.key));
  const index = tracked.findIndex((s) => s.key === key);
  if (index === -1) return { ok: false, status: 404, message: "This visit has no such stage to mark." };
  if (!["confirmed", "checked_in", "in_progress"].includes(status)) {
    const why: Partial<Record<AppointmentStatus, string>> = {
      requested: "This visit is not confirmed yet: confirm it before marking stages.",
      completed: "This visit is already completed.",
      cancelled: "This visit was cancelled, so its stages cannot be marked.",
      declined: "This visit was declined, so its stages cannot be marked.",
      no_show: "This visit is marked as a no-show, so its stages cannot be marked.",
    };
    return { ok: false, status: 409, message: why[status] ?? "This visit's stages cannot be marked now." };
  }
  const stage = tracked[index];
  const label = `“${stageLabel(stage.key)}”`;
  if (action === "start") {
    if (stage.actualStart !== null) return { ok: false, status: 409, message: `The ${label} stage has already started.` };
    const prev = tracked[index - 1];
    if (prev && prev.actualEnd === null) return { ok: false, status: 409, message: `Finish the “${stageLabel(prev.key)}” stage before starting ${label}.` };
    if (prev && prev.actualEnd !== null && at < prev.actualEnd) {
      return { ok: false, status: 422, message: `The ${label} stage cannot start before the previous stage finished.` };
    }
    const statusAfter: AppointmentStatus | null = index === 0 ? "checked_in" : index === 1 && status !== "in_progress" ? "in_progress" : null;
    return { ok: true, statusAfter: statusAfter === status ? null : statusAfter };
  }
  if (stage.actualStart === null) return { ok: false, status: 409, message: `The ${label} stage has not started, so it cannot be finished.` };
  if (stage.actualEnd !== null) return { ok: false, status: 409, message: `The ${label} stage has already finished.` };
  if (at < stage.actualStart) return { ok: false, status: 422, message: `The ${label} stage cannot finish before it started.` };
  return { ok: true, statusAfter: key === "cementation" ? "completed" : null };
}
