import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CATALOGUE, DEFAULT_STAGE_MINUTES, STAGE_ORDERS } from "@/db/seed/catalogue";
import { checkStageOrder, estimateTimeline, OCCUPIES, TimelineError, visitLengthRange, type StageMinuteRow, type TimelineInput } from "@/lib/domain/timeline";
import { STAGE_KEYS, TOOTH_CLASSES, type FinishingKind, type HeatTreatment, type StageKey } from "@/lib/domain/types";

const stageRows: StageMinuteRow[] = DEFAULT_STAGE_MINUTES.map((s) => ({ stage: s.stage, toothClass: s.toothClass ?? null, minutes: s.minutes }));
const CLINIC_STAGES = ["check_in", "anaesthesia", "preparation", "scan", "design", "try_in", "cementation", "aftercare"];

function inputFor(key: string, mode: "rapid" | "standard" | "refined", toothClass: "anterior" | "premolar" | "molar" = "molar"): TimelineInput {
  const m = CATALOGUE.find((c) => c.key === key)!;
  return { material: m, mode: m.modes.find((x) => x.mode === mode)!, toothClass, stageMinutes: stageRows };
}
const keysOf = (input: TimelineInput) => estimateTimeline(input).stages.map((s) => s.key);
/** The fabrication side of a visit: what follows the design. */
const after = (keys: StageKey[]) => keys.slice(keys.indexOf("fabrication"));

const ORDER_BY_HEAT: Record<HeatTreatment, readonly string[]> = { sintering: STAGE_ORDERS.sintered, crystallisation: STAGE_ORDERS.crystallised, none: STAGE_ORDERS.glassCeramic };

const arbitraryInput = fc.record({
  heatTreatment: fc.constantFrom<HeatTreatment>("sintering", "crystallisation", "none"),
  fabrication: fc.constantFrom("dry_milling" as const, "wet_grinding" as const),
  fabricationMinutes: fc.integer({ min: 1, max: 60 }),
  heatTreatmentMinutes: fc.integer({ min: 1, max: 120 }),
  finishing: fc.constantFrom<FinishingKind>("polish", "stain_glaze"),
  finishingMinutes: fc.integer({ min: 1, max: 40 }),
  glazeFiringMinutes: fc.integer({ min: 1, max: 30 }),
  toothClass: fc.constantFrom(...TOOTH_CLASSES),
  stageMinutes: fc.array(fc.integer({ min: 1, max: 60 }), { minLength: 8, maxLength: 8 }),
}).map((r): TimelineInput => ({
  material: { heatTreatment: r.heatTreatment, fabrication: r.fabrication, stageOrder: ORDER_BY_HEAT[r.heatTreatment] },
  mode: {
    fabricationMinutes: r.fabricationMinutes,
    heatTreatmentMinutes: r.heatTreatment === "none" ? 0 : r.heatTreatmentMinutes,
    finishing: r.finishing,
    finishingMinutes: r.finishingMinutes,
    glazeFiringMinutes: r.glazeFiringMinutes,
  },
  toothClass: r.toothClass,
  stageMinutes: CLINIC_STAGES.map((stage, i) => ({ stage, toothClass: null, minutes: r.stageMinutes[i] })),
}));

describe("stage orders per material against common practice", () => {
  // [C] REFERENCES.md (second wave): zirconia is sintered, then glaze-fired or polished, then tried in and cemented.
  it("zirconia: mill → sinter → stain and glaze → glaze firing → try-in → cement, or polish instead of the glaze", () => {
    expect(after(keysOf(inputFor("zirconia", "standard")))).toEqual(["fabrication", "heat_treatment", "finishing", "glaze_firing", "try_in", "cementation", "aftercare"]);
    expect(after(keysOf(inputFor("zirconia", "rapid")))).toEqual(["fabrication", "heat_treatment", "finishing", "try_in", "cementation", "aftercare"]);
    const t = estimateTimeline(inputFor("zirconia", "standard"));
    expect(t.stages.map((s) => s.label)).toEqual(expect.arrayContaining(["Milling", "Sintering", "Stain and glaze", "Glaze firing"]));
    expect(estimateTimeline(inputFor("zirconia", "rapid")).stages.find((s) => s.key === "finishing")!.label).toBe("Polishing");
  });

  // [C] REFERENCES.md (second wave): lithium disilicate is tried in pre-crystallised, stained and glazed, then fired once.
  it("lithium disilicate: grind → try-in → stain and glaze → combined crystallisation and glaze firing → cement", () => {
    for (const mode of ["rapid", "standard", "refined"] as const) {
      const t = estimateTimeline(inputFor("lithium-disilicate", mode));
      expect(after(t.stages.map((s) => s.key))).toEqual(["fabrication", "try_in", "finishing", "heat_treatment", "cementation", "aftercare"]);
      expect(t.stages.find((s) => s.key === "fabrication")!.label).toBe("Grinding");
      expect(t.stages.find((s) => s.key === "heat_treatment")!.label).toBe("Crystallisation and glaze firing");
      expect(t.stages.some((s) => s.key === "glaze_firing")).toBe(false);
    }
  });

  // [C] glass ceramics without heat treatment: ground, tried in, polished or glazed in an optional firing, cemented.
  it("glass ceramics: grind → try-in → polish, or an optional glaze firing → cement", () => {
    for (const key of ["feldspathic-ceramic", "leucite-glass-ceramic"]) {
      expect(after(keysOf(inputFor(key, "standard", "premolar")))).toEqual(["fabrication", "try_in", "finishing", "cementation", "aftercare"]);
      expect(after(keysOf(inputFor(key, "refined", "premolar")))).toEqual(["fabrication", "try_in", "finishing", "glaze_firing", "cementation", "aftercare"]);
    }
  });

  // [C] resin-ceramic hybrids and PMMA are never fired; PMMA is provisional and fixed with temporary cement.
  it("resin-ceramic hybrid and PMMA: mill → try-in → polish → cement, PMMA with temporary cement", () => {
    for (const key of ["resin-ceramic-hybrid", "pmma"]) {
      const t = estimateTimeline(inputFor(key, "standard"));
      expect(after(t.stages.map((s) => s.key))).toEqual(["fabrication", "try_in", "finishing", "cementation", "aftercare"]);
      expect(t.stages.some((s) => s.equipment.includes("furnace"))).toBe(false);
    }
    expect(estimateTimeline(inputFor("pmma", "standard")).stages.find((s) => s.key === "cementation")!.label).toMatch(/temporary cement/);
    expect(estimateTimeline(inputFor("resin-ceramic-hybrid", "standard")).stages.find((s) => s.key === "cementation")!.label).toBe("Cementation");
  });

  it("every seeded order passes the safe rules, and every visit starts at check-in and ends with aftercare", () => {
    for (const m of CATALOGUE) {
      expect(checkStageOrder(m.stageOrder, m), m.key).toEqual([]);
      for (const mode of m.modes) {
        const keys = keysOf({ material: m, mode, toothClass: m.toothClasses[0], stageMinutes: stageRows });
        expect(keys[0]).toBe("check_in");
        expect(keys.at(-1)).toBe("aftercare");
        expect(keys.slice(0, 5)).toEqual(["check_in", "anaesthesia", "preparation", "scan", "design"]);
      }
    }
  });
});

describe("what each stage holds", () => {
  it("every firing holds the furnace and the chair; the mill only for fabrication; every stage names what it holds", () => {
    for (const key of STAGE_KEYS) expect(OCCUPIES[key], key).toBeDefined();
    expect(OCCUPIES.heat_treatment).toEqual(["chair", "furnace"]);
    expect(OCCUPIES.glaze_firing).toEqual(["chair", "furnace"]);
    expect(STAGE_KEYS.filter((k) => OCCUPIES[k].includes("mill"))).toEqual(["fabrication"]);
  });

  it("a zirconia stain-and-glaze visit holds the furnace twice: sintering and the glaze firing", () => {
    const t = estimateTimeline(inputFor("zirconia", "standard"));
    const furnace = t.stages.filter((s) => s.equipment.includes("furnace"));
    expect(furnace.map((s) => [s.key, s.endMin - s.startMin])).toEqual([["heat_treatment", 35], ["glaze_firing", 15]]);
  });

  it("a glass-ceramic glaze firing holds the furnace; its polished mode does not", () => {
    expect(estimateTimeline(inputFor("feldspathic-ceramic", "refined", "premolar")).stages.filter((s) => s.equipment.includes("furnace")).map((s) => s.key)).toEqual(["glaze_firing"]);
    expect(estimateTimeline(inputFor("feldspathic-ceramic", "standard", "premolar")).stages.some((s) => s.equipment.includes("furnace"))).toBe(false);
  });
});

describe("the safe rules of a stage order", () => {
  const zr = CATALOGUE.find((m) => m.key === "zirconia")!;
  const ld = CATALOGUE.find((m) => m.key === "lithium-disilicate")!;
  const swap = (order: readonly string[], a: string, b: string) => order.map((k) => (k === a ? b : k === b ? a : k));

  it("refuses check-in not first, aftercare not last, a missing or doubled stage, an unknown stage", () => {
    expect(checkStageOrder(swap(zr.stageOrder, "check_in", "anaesthesia"), zr).join(" ")).toMatch(/Check-in comes first/);
    expect(checkStageOrder(swap(zr.stageOrder, "aftercare", "cementation"), zr).join(" ")).toMatch(/aftercare briefing comes last/);
    expect(checkStageOrder(zr.stageOrder.filter((k) => k !== "try_in"), zr).join(" ")).toMatch(/Try-in/);
    expect(checkStageOrder([...zr.stageOrder, "scan"], zr).join(" ")).toMatch(/twice/);
    expect(checkStageOrder([...zr.stageOrder, "polishing_wheel"], zr).join(" ")).toMatch(/not a stage/);
  });

  it("refuses preparation after the scan, the design after fabrication, and cementation before try-in", () => {
    expect(checkStageOrder(swap(zr.stageOrder, "preparation", "scan"), zr)).not.toEqual([]);
    expect(checkStageOrder(swap(zr.stageOrder, "design", "fabrication"), zr)).not.toEqual([]);
    expect(checkStageOrder(swap(ld.stageOrder, "try_in", "cementation"), ld).join(" ")).toMatch(/Cementation comes after try-in/);
  });

  it("refuses a firing before fabrication, a glaze firing before the glaze, and a zirconia try-in before sintering", () => {
    expect(checkStageOrder(swap(zr.stageOrder, "fabrication", "heat_treatment"), zr)).not.toEqual([]);
    expect(checkStageOrder(swap(zr.stageOrder, "finishing", "glaze_firing"), zr).join(" ")).toMatch(/glaze firing comes after/);
    const tryInFirst = [...STAGE_ORDERS.crystallised.slice(0, 6), "try_in", "heat_treatment", "finishing", "glaze_firing", "cementation", "aftercare"];
    expect(checkStageOrder(tryInFirst, zr).join(" ")).toMatch(/tried in after sintering/);
    // The same order without the sintering rule is fine for a material fired by crystallisation.
    expect(checkStageOrder(tryInFirst, ld)).toEqual([]);
  });

  it("refuses a heat-treated material without its firing and a never-fired one with a firing", () => {
    expect(checkStageOrder(STAGE_ORDERS.resin, ld).join(" ")).toMatch(/heat-treated/);
    expect(checkStageOrder(STAGE_ORDERS.sintered, { heatTreatment: "none" }).join(" ")).toMatch(/no heat treatment/);
  });

  it("refuses stain and glaze where nothing fires it afterwards", () => {
    const input = inputFor("resin-ceramic-hybrid", "standard");
    expect(() => estimateTimeline({ ...input, mode: { ...input.mode, finishing: "stain_glaze" } })).toThrow(/needs a firing/);
    const zrInput = inputFor("zirconia", "standard");
    expect(() => estimateTimeline({ ...zrInput, mode: { ...zrInput.mode, glazeFiringMinutes: 0 } })).toThrow(TimelineError);
  });
});

describe("visit timeline estimator", () => {
  it("adds up a zirconia molar crown in the standard mode", () => {
    const t = estimateTimeline(inputFor("zirconia", "standard"));
    // 5 + 10 + 30 (molar preparation) + 10 + 15 + 12 milling + 35 sintering + 5 stain + 15 glaze firing + 10 + 15 + 10
    expect(t.totalMinutes).toBe(172);
    expect(t.chairFreeAtMin).toBe(162);
  });

  it("uses the tooth-class override for preparation", () => {
    const anterior = estimateTimeline(inputFor("lithium-disilicate", "standard", "anterior"));
    const molar = estimateTimeline(inputFor("lithium-disilicate", "standard", "molar"));
    expect(molar.totalMinutes - anterior.totalMinutes).toBe(10);
  });

  it("refuses a missing clinic stage duration with the stage's name", () => {
    const input = inputFor("zirconia", "rapid");
    expect(() => estimateTimeline({ ...input, stageMinutes: stageRows.filter((r) => r.stage !== "scan") })).toThrow(/Digital impression/);
  });

  it("gives the patient a rounded range around the estimate, never shorter than the estimate's quarter hour", () => {
    expect(visitLengthRange(172)).toEqual({ fromMinutes: 165, toMinutes: 195, text: "about 2 h 45 min to 3 h 15 min" });
    expect(visitLengthRange(120).text).toBe("about 2 h to 2 h 15 min");
    expect(visitLengthRange(50).text).toBe("about 45 min to 1 h 15 min");
    fc.assert(fc.property(fc.integer({ min: 1, max: 600 }), (m) => {
      const r = visitLengthRange(m);
      expect(r.fromMinutes).toBeLessThanOrEqual(Math.max(m, 15));
      expect(r.toMinutes).toBeGreaterThan(m);
      expect(r.toMinutes - r.fromMinutes).toBeLessThanOrEqual(45);
    }));
  });

  describe("properties", () => {
    it("stages never overlap, follow each other without gaps, and add up to the total", () => {
      fc.assert(fc.property(arbitraryInput, (input) => {
        let t;
        try {
          t = estimateTimeline(input);
        } catch (err) {
          // Only a stain-and-glaze finish with nothing to fire it may be refused.
          expect(err).toBeInstanceOf(TimelineError);
          expect(input.mode.finishing).toBe("stain_glaze");
          return;
        }
        expect(t.stages[0].startMin).toBe(0);
        for (let i = 1; i < t.stages.length; i++) expect(t.stages[i].startMin).toBe(t.stages[i - 1].endMin);
        for (const s of t.stages) expect(s.endMin).toBeGreaterThan(s.startMin);
        expect(t.stages.at(-1)!.endMin).toBe(t.totalMinutes);
        expect(t.chairFreeAtMin).toBeLessThanOrEqual(t.totalMinutes);
      }));
    });

    it("the furnace is held exactly when something is fired, and a stain-and-glaze finish is always fired after it", () => {
      fc.assert(fc.property(arbitraryInput, (input) => {
        const t = estimateTimeline(input);
        const fired = t.stages.filter((s) => s.equipment.includes("furnace"));
        expect(fired.length > 0).toBe(input.material.heatTreatment !== "none" || input.mode.finishing === "stain_glaze");
        if (input.mode.finishing === "stain_glaze") {
          const finishing = t.stages.find((s) => s.key === "finishing")!;
          expect(fired.some((s) => s.startMin >= finishing.endMin)).toBe(true);
        }
      }));
    });

    it("the mill is used by exactly one stage and the dentist never during fabrication", () => {
      fc.assert(fc.property(arbitraryInput, (input) => {
        const t = estimateTimeline(input);
        expect(t.stages.filter((s) => s.equipment.includes("mill")).map((s) => s.key)).toEqual(["fabrication"]);
        expect(t.stages.find((s) => s.key === "fabrication")!.equipment).not.toContain("dentist");
      }));
    });
  });

  it("rapid is never slower than refined for any seeded material, tooth class and stage minutes", () => {
    fc.assert(fc.property(
      fc.constantFrom(...CATALOGUE.filter((m) => m.modes.some((x) => x.mode === "refined"))),
      fc.constantFrom(...TOOTH_CLASSES),
      fc.array(fc.integer({ min: 1, max: 60 }), { minLength: 8, maxLength: 8 }),
      (m, toothClass, minutes) => {
        const stageMinutes = CLINIC_STAGES.map((stage, i) => ({ stage, toothClass: null, minutes: minutes[i] }));
        const time = (mode: "rapid" | "refined") => estimateTimeline({ material: m, mode: m.modes.find((x) => x.mode === mode)!, toothClass, stageMinutes }).totalMinutes;
        expect(time("rapid")).toBeLessThanOrEqual(time("refined"));
      },
    ));
  });
});

// [C] REFERENCES.md stage times: a whole single-visit crown takes about 1.5–2.5 h (90–150 minutes).
// The bound is the common-practice range; combinations outside it are listed, not hidden by a wider bound.
describe("the fastest mode against the common-practice visit length", () => {
  const LOW = 90;
  const HIGH = 150;
  const fastest = CATALOGUE.flatMap((m) => m.toothClasses.map((tc) => {
    const mode = m.modes.find((x) => x.mode === "rapid") ?? m.modes[0];
    return { key: `${m.key} ${mode.mode} ${tc}`, minutes: estimateTimeline({ material: m, mode, toothClass: tc, stageMinutes: stageRows }).totalMinutes };
  }));

  it("no fastest-mode visit is shorter than 1.5 h", () => {
    for (const f of fastest) expect(f.minutes, f.key).toBeGreaterThanOrEqual(LOW);
  });

  it("every material's fastest mode fits within 2.5 h", () => {
    expect(fastest.filter((f) => f.minutes > HIGH).map((f) => `${f.key}: ${f.minutes} min`)).toEqual([]);
  });

  it("reports exactly which slower-mode combinations run past 2.5 h", () => {
    const over = CATALOGUE.flatMap((m) => m.modes.flatMap((mode) => m.toothClasses.map((tc) => ({
      key: `${m.key} ${mode.mode} ${tc}`,
      minutes: estimateTimeline({ material: m, mode, toothClass: tc, stageMinutes: stageRows }).totalMinutes,
    })))).filter((f) => f.minutes > HIGH).map((f) => `${f.key}: ${f.minutes} min`);
    // Listed in docs/clinical-references.md; a change to the seeded minutes must update both.
    expect(over).toEqual([
      "zirconia standard anterior: 162 min", "zirconia standard premolar: 167 min", "zirconia standard molar: 172 min",
      "zirconia refined anterior: 176 min", "zirconia refined premolar: 181 min", "zirconia refined molar: 186 min",
      "lithium-disilicate standard molar: 152 min",
      "lithium-disilicate refined anterior: 157 min", "lithium-disilicate refined premolar: 162 min", "lithium-disilicate refined molar: 167 min",
    ]);
  });
});
