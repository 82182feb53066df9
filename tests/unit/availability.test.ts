import { describe, expect, it } from "vitest";
import { CATALOGUE, DEFAULT_STAGE_MINUTES } from "@/db/seed/catalogue";
import { BusyIndex, candidateStarts, findSlots, holdsFor, isCandidateStart, nearest, type AvailabilityRules, type Resources } from "@/lib/domain/availability";
import { estimateTimeline } from "@/lib/domain/timeline";
import { isoInZone } from "@/lib/domain/time-zone";

const stageMinutes = DEFAULT_STAGE_MINUTES.map((s) => ({ stage: s.stage, toothClass: s.toothClass ?? null, minutes: s.minutes }));
const zr = CATALOGUE.find((m) => m.key === "zirconia")!;
const feld = CATALOGUE.find((m) => m.key === "feldspathic-ceramic")!;
const zrStandard = estimateTimeline({ material: zr, mode: zr.modes.find((m) => m.mode === "standard")!, toothClass: "molar", stageMinutes });
const feldRapid = estimateTimeline({ material: feld, mode: feld.modes[0], toothClass: "premolar", stageMinutes });

const weekdays = (opens: string, closes: string, days = [1, 2, 3, 4, 5]) => days.map((weekday) => ({ weekday, opens, closes }));
const rules = (over: Partial<AvailabilityRules> = {}): AvailabilityRules => ({
  zone: "America/Toronto",
  openingHours: [...weekdays("08:00", "12:30"), ...weekdays("13:30", "18:00")],
  closedDays: [],
  slotMinutes: 15,
  bufferMinutes: 10,
  minNoticeMinutes: 120,
  ...over,
});
const resources: Resources = { chair: ["c1", "c2"], mill: ["m1"], furnace: ["f1"], dentist: ["d1"] };
const longAgo = new Date("2020-01-01T00:00:00Z");
const none = new BusyIndex([]);

/** Wall-clock time of an instant in a zone, straight from the Intl time-zone data (the outside reference). */
function intlWallClock(instant: Date, zone: string) {
  return new Intl.DateTimeFormat("en-CA", { timeZone: zone, year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", hourCycle: "h23" }).format(instant);
}

describe("availability", () => {
  it("offers grid starts where the whole visit fits inside one opening interval", () => {
    // 2027-03-10 is a Wednesday. 172 min visit: morning 08:00–09:30 (09:30 + 172 ≤ 12:30), afternoon 13:30–15:00.
    const slots = findSlots({ timeline: zrStandard, rules: rules(), resources, busy: none, from: "2027-03-10", days: 1, now: longAgo });
    const times = slots.map((s) => isoInZone(s.start, "America/Toronto").slice(11, 16));
    expect(times[0]).toBe("08:00");
    expect(times).toContain("09:30");
    expect(times).not.toContain("09:45"); // 09:45 + 172 min = 12:37, past the lunch break
    expect(times).toContain("13:30");
    expect(times.at(-1)).toBe("15:00");
    for (const s of slots) expect(s.end.getTime() - s.start.getTime()).toBe(172 * 60_000);
  });

  it("skips closed weekdays and closed days", () => {
    // 2027-03-13 Saturday and 2027-03-14 Sunday are not in these opening hours; 2027-03-15 is a closed day.
    expect(findSlots({ timeline: feldRapid, rules: rules({ closedDays: ["2027-03-15"] }), resources, busy: none, from: "2027-03-13", days: 3, now: longAgo })).toEqual([]);
  });

  it("keeps the minimum notice", () => {
    const now = new Date("2027-03-10T13:05:00Z"); // 08:05 in Toronto (EST, UTC−5)
    const starts = candidateStarts(rules(), feldRapid.totalMinutes, "2027-03-10", 1, now);
    expect(starts[0].toISOString()).toBe("2027-03-10T15:15:00.000Z"); // 10:15 local, the first grid time ≥ 10:05
  });

  // The clinic's zone, America/Toronto, changes on Sunday 2027-03-14 (spring forward) and Sunday 2026-11-01 (fall back).
  // Expected wall-clock times come from the Intl time-zone data (the outside reference).
  it.each([
    ["2027-03-13", "2027-03-15"],
    ["2026-10-31", "2026-11-02"],
  ])("puts slots at the same wall-clock times across the DST change from %s to %s", (from, to) => {
    const everyDay = rules({ openingHours: weekdays("08:00", "12:30", [0, 1, 2, 3, 4, 5, 6]) });
    const slots = findSlots({ timeline: feldRapid, rules: everyDay, resources, busy: none, from, days: 3, now: longAgo });
    const byDay = new Map<string, string[]>();
    for (const s of slots) {
      const [day, time] = intlWallClock(s.start, "America/Toronto").split(", ");
      byDay.set(day, [...(byDay.get(day) ?? []), time]);
    }
    const days = [...byDay.keys()];
    expect(days).toEqual([from, days[1], to]);
    expect(byDay.get(days[0])).toEqual(byDay.get(days[1]));
    expect(byDay.get(days[1])).toEqual(byDay.get(days[2]));
    expect(byDay.get(days[1])![0]).toBe("08:00");
    // The first slot's UTC instant moves by exactly one hour across the change.
    const firstOf = (day: string) => slots.find((s) => intlWallClock(s.start, "America/Toronto").startsWith(day))!.start.getTime();
    expect(Math.abs(firstOf(days[2]) - firstOf(days[0]) - 2 * 86_400_000)).toBe(3_600_000);
  });

  it("handles a half-hour zone on its DST change (Australia/Adelaide, 2027-04-04)", () => {
    const everyDay = rules({ zone: "Australia/Adelaide", openingHours: weekdays("09:00", "12:00", [0, 1, 2, 3, 4, 5, 6]) });
    const slots = findSlots({ timeline: feldRapid, rules: everyDay, resources, busy: none, from: "2027-04-03", days: 2, now: longAgo });
    const firsts = ["2027-04-03", "2027-04-04"].map((d) => slots.find((s) => intlWallClock(s.start, "Australia/Adelaide").startsWith(d))!);
    for (const s of firsts) expect(intlWallClock(s.start, "Australia/Adelaide").endsWith("09:00")).toBe(true);
    // [P] IANA tz data via Intl: +10:30 before the change, +09:30 after it.
    expect(isoInZone(firsts[0].start, "Australia/Adelaide").slice(-6)).toBe("+10:30");
    expect(isoInZone(firsts[1].start, "Australia/Adelaide").slice(-6)).toBe("+09:30");
  });

  it("uses a second chair when the first is busy, and none when the only dentist is busy", () => {
    const start = new Date("2027-03-10T13:00:00Z");
    const holds = holdsFor(zrStandard, start.getTime(), 10);
    const chairSpan = { start: Math.min(...holds.filter((h) => h.kind === "chair").map((h) => h.start)), end: Math.max(...holds.filter((h) => h.kind === "chair").map((h) => h.end)) };
    const chairBusy = new BusyIndex([{ resourceId: "c1", ...chairSpan }]);
    const slot = findSlots({ timeline: zrStandard, rules: rules(), resources, busy: chairBusy, from: "2027-03-10", days: 1, now: longAgo })[0];
    expect(slot.start).toEqual(start);
    expect(slot.assignment.chair).toBe("c2");

    const anaesthesia = holds.find((h) => h.stage === "anaesthesia" && h.kind === "dentist")!;
    const dentistBusy = new BusyIndex([{ resourceId: "d1", start: anaesthesia.start, end: anaesthesia.end }]);
    const starts = findSlots({ timeline: zrStandard, rules: rules(), resources, busy: dentistBusy, from: "2027-03-10", days: 1, now: longAgo }).map((s) => s.start.getTime());
    expect(starts).not.toContain(start.getTime());
  });

  it("lets the dentist start a second visit while the first crown is milled and fired", () => {
    // Zirconia refined, molar: the dentist is free from design's end (70 min) to try-in (151 min); the one
    // furnace sinters it from 88 to 128 min and glaze-fires it from 136 to 151 min.
    const zrRefined = estimateTimeline({ material: zr, mode: zr.modes.find((m) => m.mode === "refined")!, toothClass: "molar", stageMinutes });
    const first = new Date("2027-03-10T13:00:00Z");
    const holds = holdsFor(zrRefined, first.getTime(), 10);
    const ids = { chair: "c1", dentist: "d1", mill: "m1", furnace: "f1" } as const;
    const busy = new BusyIndex(holds.map((h) => ({ resourceId: ids[h.kind], start: h.start, end: h.end })));
    const zrAnterior = estimateTimeline({ material: zr, mode: zr.modes.find((m) => m.mode === "standard")!, toothClass: "anterior", stageMinutes });
    const slots = findSlots({ timeline: zrAnterior, rules: rules(), resources, busy, from: "2027-03-10", days: 1, now: longAgo });
    // A zirconia front tooth needs the dentist from +5 to +60 min and the furnace from +72 to +107 min.
    // Starting at 09:15 its sintering (10:27) would meet the first crown's glaze firing (10:16–10:31): refused.
    // Starting at 09:30 the dentist is done at 10:30, before the first try-in (10:31), the furnace is free from
    // 10:31, and its own try-in (11:37) comes after the first cementation ends (10:56).
    const second = slots.find((s) => s.start.toISOString() === "2027-03-10T14:30:00.000Z");
    expect(second?.assignment.chair).toBe("c2");
    expect(slots.some((s) => s.start.toISOString() === "2027-03-10T14:15:00.000Z")).toBe(false);
    expect(slots.some((s) => s.start.toISOString() === "2027-03-10T14:00:00.000Z")).toBe(false);
    // No offered slot needs the single mill while the first crown is on it.
    const mill = holds.find((h) => h.kind === "mill")!;
    for (const s of slots) {
      const fab = holdsFor(zrAnterior, s.start.getTime(), 10).find((h) => h.kind === "mill")!;
      expect(fab.end <= mill.start || fab.start >= mill.end).toBe(true);
    }
  });

  it("keeps the chair's cleaning buffer after cementation", () => {
    const holds = holdsFor(feldRapid, 0, 10);
    const cementation = holds.find((h) => h.stage === "cementation" && h.kind === "chair")!;
    expect(cementation.end).toBe((feldRapid.chairFreeAtMin + 10) * 60_000);
    expect(holds.find((h) => h.stage === "cementation" && h.kind === "dentist")!.end).toBe(feldRapid.chairFreeAtMin * 60_000);
  });

  it("recognises grid starts and refuses off-grid or out-of-hours ones", () => {
    const r = rules();
    expect(isCandidateStart(r, feldRapid.totalMinutes, new Date("2027-03-10T13:15:00Z"), longAgo)).toBe(true);
    expect(isCandidateStart(r, feldRapid.totalMinutes, new Date("2027-03-10T13:10:00Z"), longAgo)).toBe(false);
    expect(isCandidateStart(r, feldRapid.totalMinutes, new Date("2027-03-10T23:00:00Z"), longAgo)).toBe(false);
    expect(isCandidateStart(r, feldRapid.totalMinutes, new Date("2027-03-10T13:15:00Z"), new Date("2027-03-10T14:00:00Z"))).toBe(false);
  });

  it("lists the nearest free alternatives in time order", () => {
    const slots = findSlots({ timeline: feldRapid, rules: rules(), resources, busy: none, from: "2027-03-10", days: 1, now: longAgo });
    const near = nearest(slots, new Date("2027-03-10T14:00:00Z"), 3);
    expect(near.map((s) => s.start.toISOString())).toEqual(["2027-03-10T13:45:00.000Z", "2027-03-10T14:00:00.000Z", "2027-03-10T14:15:00.000Z"]);
  });
});
