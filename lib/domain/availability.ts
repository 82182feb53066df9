// Availability search: start times in the clinic's zone, inside opening hours, on a grid, where
// every stage's equipment and the dentist are free for that stage's window. Pure: the caller
// loads the busy intervals (reservations and out-of-service ranges) and passes them in.
import type { Timeline } from "./timeline";
import { addDays, localDate, weekdayOf, zonedTime } from "./time-zone";
import type { ResourceKind, StageKey } from "./types";

export type Interval = { start: number; end: number }; // epoch ms, end exclusive

export type OpeningInterval = { weekday: number; opens: string; closes: string };

export type AvailabilityRules = {
  zone: string;
  openingHours: OpeningInterval[];
  closedDays: string[];
  slotMinutes: number;
  bufferMinutes: number;
  minNoticeMinutes: number;
};

/** Resource ids per kind; `dentist` holds the proposal's dentist. */
export type Resources = Record<ResourceKind, string[]>;

export type Hold = { kind: ResourceKind; stage: StageKey; start: number; end: number };
export type Assignment = Record<ResourceKind, string | null>;
export type Slot = { start: Date; end: Date; assignment: Assignment };

const MIN = 60_000;

/** The windows a visit starting at `start` holds, per resource kind. The chair keeps a
 *  cleaning buffer after the last stage that uses it. */
export function holdsFor(timeline: Timeline, start: number, bufferMinutes: number): Hold[] {
  const holds: Hold[] = [];
  for (const s of timeline.stages) {
    for (const kind of s.equipment) {
      const extra = kind === "chair" && s.endMin === timeline.chairFreeAtMin ? bufferMinutes : 0;
      holds.push({ kind, stage: s.key, start: start + s.startMin * MIN, end: start + (s.endMin + extra) * MIN });
    }
  }
  return holds;
}

export class BusyIndex {
  private readonly byResource = new Map<string, Interval[]>();

  constructor(entries: Iterable<{ resourceId: string; start: number; end: number }>) {
    for (const e of entries) {
      const list = this.byResource.get(e.resourceId) ?? [];
      list.push({ start: e.start, end: e.end });
      this.byResource.set(e.resourceId, list);
    }
    for (const list of this.byResource.values()) list.sort((a, b) => a.start - b.start);
  }

  /** True when none of the windows overlaps a busy interval of the resource (half-open intervals). */
  isFree(resourceId: string, windows: Interval[]): boolean {
    const list = this.byResource.get(resourceId);
    if (!list) return true;
    for (const w of windows) {
      // Binary search for the first busy interval ending after the window starts.
      let lo = 0;
      let hi = list.length;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (list[mid].end <= w.start) lo = mid + 1;
        else hi = mid;
      }
      if (lo < list.length && list[lo].start < w.end) return false;
    }
    return true;
  }
}

/** Picks one free resource of each kind for all of that kind's windows, or null if a kind has none. */
export function assign(holds: Hold[], resources: Resources, busy: BusyIndex): Assignment | null {
  const assignment: Assignment = { chair: null, dentist: null, mill: null, furnace: null };
  for (const kind of Object.keys(assignment) as ResourceKind[]) {
    const windows = holds.filter((h) => h.kind === kind);
    if (windows.length === 0) continue;
    const free = resources[kind].find((id) => busy.isFree(id, windows));
    if (!free) return null;
    assignment[kind] = free;
  }
  return assignment;
}

/** Grid start times inside opening hours and past the minimum notice, before looking at equipment. */
export function candidateStarts(rules: AvailabilityRules, totalMinutes: number, from: string, days: number, now: Date): Date[] {
  const earliest = now.getTime() + rules.minNoticeMinutes * MIN;
  const closed = new Set(rules.closedDays);
  const out: Date[] = [];
  for (let d = 0; d < days; d++) {
    const date = addDays(from, d);
    if (closed.has(date)) continue;
    const weekday = weekdayOf(date);
    const intervals = rules.openingHours.filter((h) => h.weekday === weekday).sort((a, b) => a.opens.localeCompare(b.opens));
    for (const h of intervals) {
      const opens = zonedTime(date, h.opens, rules.zone).getTime();
      const closes = zonedTime(date, h.closes, rules.zone).getTime();
      for (let t = opens; t + totalMinutes * MIN <= closes; t += rules.slotMinutes * MIN) {
        if (t >= earliest) out.push(new Date(t));
      }
    }
  }
  return out;
}

export function findSlots(input: {
  timeline: Timeline;
  rules: AvailabilityRules;
  resources: Resources;
  busy: BusyIndex;
  from: string;
  days: number;
  now: Date;
}): Slot[] {
  const { timeline, rules, resources, busy } = input;
  const slots: Slot[] = [];
  for (const start of candidateStarts(rules, timeline.totalMinutes, input.from, input.days, input.now)) {
    const assignment = assign(holdsFor(timeline, start.getTime(), rules.bufferMinutes), resources, busy);
    if (assignment) slots.push({ start, end: new Date(start.getTime() + timeline.totalMinutes * MIN), assignment });
  }
  return slots;
}

/** Whether `start` is a grid time inside opening hours and past the notice, for clear refusals. */
export function isCandidateStart(rules: AvailabilityRules, totalMinutes: number, start: Date, now: Date): boolean {
  const day = localDate(start, rules.zone);
  return candidateStarts(rules, totalMinutes, day, 1, now).some((c) => c.getTime() === start.getTime());
}

/** The free slots nearest to a wanted time, earlier or later. */
export function nearest(slots: Slot[], wanted: Date, count = 3): Slot[] {
  return [...slots].sort((a, b) => Math.abs(a.start.getTime() - wanted.getTime()) - Math.abs(b.start.getTime() - wanted.getTime())).slice(0, count)
    .sort((a, b) => a.start.getTime() - b.start.getTime());
}
