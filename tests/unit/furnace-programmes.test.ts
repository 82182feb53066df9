import { describe, expect, it } from "vitest";
import { CATALOGUE, DEFAULT_STAGE_MINUTES } from "@/db/seed/catalogue";
import { BusyIndex, findSlots, type AvailabilityRules } from "@/lib/domain/availability";
import { capableFurnaces, ProgrammeUnavailable, withProgrammeMinutes, type FurnaceProgrammeRow } from "@/lib/domain/furnace-programmes";
import { estimateTimeline } from "@/lib/domain/timeline";

const speed: FurnaceProgrammeRow = { id: "p-speed", name: "Speed sinter", minutes: 20, furnaceIds: ["f-fast"] };
const classic: FurnaceProgrammeRow = { id: "p-classic", name: "Classic sinter", minutes: 35, furnaceIds: ["f-fast", "f-slow"] };
const glaze: FurnaceProgrammeRow = { id: "p-glaze", name: "Glaze", minutes: 12, furnaceIds: ["f-slow", "f-fast"] };

describe("furnace programmes", () => {
  it("uses every working furnace when no programme is assigned", () => {
    expect(capableFurnaces(["f-slow", "f-fast"], [null, null])).toEqual(["f-slow", "f-fast"]);
  });

  it("keeps only the furnaces able to run every programme of the visit", () => {
    expect(capableFurnaces(["f-slow", "f-fast"], [speed, glaze])).toEqual(["f-fast"]);
    expect(capableFurnaces(["f-slow", "f-fast"], [classic, glaze])).toEqual(["f-slow", "f-fast"]);
  });

  it("refuses a programme no working furnace can run, naming it: a clinic without a speed furnace gets no rapid zirconia", () => {
    expect(() => capableFurnaces(["f-slow"], [speed, null])).toThrow(ProgrammeUnavailable);
    expect(() => capableFurnaces(["f-slow"], [speed, null])).toThrow(/“Speed sinter”/);
  });

  it("takes the firing minutes from the programmes", () => {
    const zr = CATALOGUE.find((m) => m.key === "zirconia")!;
    const standard = zr.modes.find((m) => m.mode === "standard")!;
    const mode = withProgrammeMinutes(standard, { heat: classic, glaze });
    expect([mode.heatTreatmentMinutes, mode.glazeFiringMinutes]).toEqual([35, 12]);
    const rows = DEFAULT_STAGE_MINUTES.map((s) => ({ stage: s.stage, toothClass: s.toothClass ?? null, minutes: s.minutes }));
    const t = estimateTimeline({ material: zr, mode, toothClass: "molar", stageMinutes: rows });
    expect(t.stages.filter((s) => s.equipment.includes("furnace")).map((s) => s.endMin - s.startMin)).toEqual([35, 12]);
  });

  it("availability never places a programme on a furnace that cannot run it", () => {
    const zr = CATALOGUE.find((m) => m.key === "zirconia")!;
    const rapid = zr.modes.find((m) => m.mode === "rapid")!;
    const rows = DEFAULT_STAGE_MINUTES.map((s) => ({ stage: s.stage, toothClass: s.toothClass ?? null, minutes: s.minutes }));
    const timeline = estimateTimeline({ material: zr, mode: withProgrammeMinutes(rapid, { heat: speed, glaze: null }), toothClass: "molar", stageMinutes: rows });
    const rules: AvailabilityRules = { zone: "America/Toronto", openingHours: [{ weekday: 3, opens: "08:00", closes: "18:00" }], closedDays: [], slotMinutes: 15, bufferMinutes: 10, minNoticeMinutes: 0 };
    const furnace = capableFurnaces(["f-slow", "f-fast"], [speed]);
    const slots = findSlots({ timeline, rules, resources: { chair: ["c1"], mill: ["m1"], dentist: ["d1"], furnace }, busy: new BusyIndex([]), from: "2027-03-10", days: 1, now: new Date("2020-01-01T00:00:00Z") });
    expect(slots.length).toBeGreaterThan(0);
    for (const s of slots) expect(s.assignment.furnace).toBe("f-fast");
  });
});
