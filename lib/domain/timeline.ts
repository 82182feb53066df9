// Visit timeline estimator: from material, finishing mode, tooth class and the clinic's stage
// minutes to the ordered stages, their offsets from the visit start, and what each occupies.
// The order of the stages is the material's data (its stage order), checked by `checkStageOrder`.
import type { FinishingKind, Fabrication, HeatTreatment, ResourceKind, StageKey, ToothClass } from "./types";
import { STAGE_KEYS } from "./types";

export type StageMinuteRow = { stage: string; toothClass: ToothClass | null; minutes: number };

export type TimelineMaterial = {
  fabrication: Fabrication;
  heatTreatment: HeatTreatment;
  /** The stages of a visit with this material, in order (data the clinic manager may edit). */
  stageOrder: readonly string[];
  provisionalOnly?: boolean;
};

export type TimelineMode = {
  fabricationMinutes: number;
  heatTreatmentMinutes: number;
  finishing: FinishingKind;
  finishingMinutes: number;
  /** Minutes of the separate glaze firing, used when the order has one and the finish is stain and glaze. */
  glazeFiringMinutes?: number;
};

export type TimelineInput = {
  material: TimelineMaterial;
  mode: TimelineMode;
  toothClass: ToothClass;
  stageMinutes: StageMinuteRow[];
};

export type PlannedStage = {
  key: StageKey;
  label: string;
  startMin: number;
  endMin: number;
  equipment: ResourceKind[];
};

export type Timeline = {
  stages: PlannedStage[];
  totalMinutes: number;
  /** Minutes from the start when the chair is free again (the patient may leave the chair). */
  chairFreeAtMin: number;
};

export class TimelineError extends Error {}

const LABELS: Record<StageKey, string> = {
  check_in: "Check-in",
  anaesthesia: "Anaesthesia",
  preparation: "Tooth preparation",
  scan: "Digital impression (scan)",
  design: "Crown design",
  fabrication: "Fabrication",
  heat_treatment: "Heat treatment",
  finishing: "Finishing",
  glaze_firing: "Glaze firing",
  try_in: "Try-in",
  cementation: "Cementation",
  aftercare: "Aftercare briefing",
};

/** Stages that use the furnace: every firing holds one. */
export const FIRING_STAGES: readonly StageKey[] = ["heat_treatment", "glaze_firing"];

export function stageLabel(key: StageKey, input?: { material: Partial<TimelineMaterial>; mode: Pick<TimelineMode, "finishing"> }): string {
  if (!input) return LABELS[key];
  const { material, mode } = input;
  if (key === "fabrication") return material.fabrication === "dry_milling" ? "Milling" : "Grinding";
  if (key === "heat_treatment") {
    if (material.heatTreatment === "sintering") return "Sintering";
    const order = material.stageOrder ?? [];
    // Stain and glaze applied before the crystallisation firing are fired with it, in one go.
    const combined = mode.finishing === "stain_glaze" && order.indexOf("finishing") !== -1 && order.indexOf("finishing") < order.indexOf("heat_treatment");
    return combined ? "Crystallisation and glaze firing" : "Crystallisation firing";
  }
  if (key === "finishing") return mode.finishing === "stain_glaze" ? "Stain and glaze" : "Polishing";
  if (key === "cementation" && material.provisionalOnly) return "Cementation (temporary cement)";
  return LABELS[key];
}

/** What each stage occupies. The patient stays in the chair until cementation ends; the
 *  aftercare briefing happens away from the chair. The dentist is free while the crown is
 *  being made, fired and finished, so they can work at another chair. Every firing holds the furnace. */
export const OCCUPIES: Record<StageKey, ResourceKind[]> = {
  check_in: ["chair"],
  anaesthesia: ["chair", "dentist"],
  preparation: ["chair", "dentist"],
  scan: ["chair", "dentist"],
  design: ["chair", "dentist"],
  fabrication: ["chair", "mill"],
  heat_treatment: ["chair", "furnace"],
  finishing: ["chair"],
  glaze_firing: ["chair", "furnace"],
  try_in: ["chair", "dentist"],
  cementation: ["chair", "dentist"],
  aftercare: [],
};

const REQUIRED: readonly StageKey[] = ["check_in", "preparation", "scan", "design", "fabrication", "finishing", "try_in", "cementation", "aftercare"];

/** The safe rules a stage order must keep, whatever the clinic edits. Returns the problems, empty when fine. */
export function checkStageOrder(order: readonly string[], material: Pick<TimelineMaterial, "heatTreatment">): string[] {
  const problems: string[] = [];
  const known = new Set<string>(STAGE_KEYS);
  for (const k of order) if (!known.has(k)) problems.push(`"${k}" is not a stage.`);
  if (new Set(order).size !== order.length) problems.push("A stage appears twice.");
  for (const k of REQUIRED) if (!order.includes(k)) problems.push(`The order needs the stage "${LABELS[k]}".`);
  const heats = material.heatTreatment !== "none";
  if (heats && !order.includes("heat_treatment")) problems.push("This material is heat-treated, so the order needs its firing.");
  if (!heats && order.includes("heat_treatment")) problems.push("This material has no heat treatment, so the order cannot have one.");
  if (problems.length) return problems;

  const at = (k: StageKey) => order.indexOf(k);
  const has = (k: StageKey) => at(k) !== -1;
  const before = (a: StageKey, b: StageKey, why: string) => {
    if (has(a) && has(b) && at(a) > at(b)) problems.push(why);
  };
  if (at("check_in") !== 0) problems.push("Check-in comes first.");
  if (at("aftercare") !== order.length - 1) problems.push("The aftercare briefing comes last.");
  before("anaesthesia", "preparation", "Anaesthesia comes before tooth preparation.");
  before("preparation", "scan", "Tooth preparation comes before the scan.");
  before("scan", "design", "The scan comes before the design.");
  before("design", "fabrication", "The design comes before fabrication.");
  for (const k of ["heat_treatment", "glaze_firing", "finishing", "try_in"] as const) before("fabrication", k, `${LABELS[k]} comes after fabrication.`);
  for (const k of ["try_in", "heat_treatment", "glaze_firing", "finishing"] as const) before(k, "cementation", `Cementation comes after ${LABELS[k].toLowerCase()}.`);
  before("finishing", "glaze_firing", "The glaze firing comes after the stain and glaze are applied.");
  if (material.heatTreatment === "sintering") {
    // A sintered crown shrinks to its size in the furnace: it can only be tried in, stained or glazed afterwards.
    before("heat_treatment", "try_in", "A sintered crown is tried in after sintering.");
    before("heat_treatment", "finishing", "A sintered crown is finished after sintering.");
    before("heat_treatment", "glaze_firing", "The glaze firing comes after sintering.");
  }
  return problems;
}

/** The stages a visit with this material and mode really has, in order: the glaze firing only for a stain-and-glaze finish. */
export function stagesFor(material: Pick<TimelineMaterial, "stageOrder">, mode: Pick<TimelineMode, "finishing">): StageKey[] {
  return (material.stageOrder as StageKey[]).filter((k) => k !== "glaze_firing" || mode.finishing === "stain_glaze");
}

/** The clinic's minutes for a stage, a tooth-class row winning over the general row. */
export function minutesFor(rows: StageMinuteRow[], stage: string, toothClass: ToothClass): number {
  const specific = rows.find((r) => r.stage === stage && r.toothClass === toothClass);
  const general = rows.find((r) => r.stage === stage && r.toothClass === null);
  const minutes = (specific ?? general)?.minutes;
  if (minutes === undefined) throw new TimelineError(`The clinic has no duration for the stage "${LABELS[stage as StageKey] ?? stage}".`);
  if (!Number.isInteger(minutes) || minutes <= 0) throw new TimelineError(`The duration of "${stage}" must be a whole number of minutes above zero.`);
  return minutes;
}

export function estimateTimeline(input: TimelineInput): Timeline {
  const { material, mode, toothClass, stageMinutes } = input;
  const problems = checkStageOrder(material.stageOrder, material);
  if (problems.length) throw new TimelineError(`The stage order of this material is not usable: ${problems.join(" ")}`);
  const keys = stagesFor(material, mode);
  const heats = material.heatTreatment !== "none";
  if (heats && !(mode.heatTreatmentMinutes > 0)) throw new TimelineError("A material that is heat-treated needs heat-treatment minutes for this mode.");
  if (mode.finishing === "stain_glaze") {
    // A stain-and-glaze finish is always fired: by a glaze firing, or by a firing that follows it.
    const fired = keys.includes("glaze_firing") || (heats && keys.indexOf("heat_treatment") > keys.indexOf("finishing"));
    if (!fired) throw new TimelineError("Stain and glaze needs a firing after it; this material's order has none, so it is polished.");
  }
  const firstMinutes: Partial<Record<StageKey, number>> = {
    fabrication: mode.fabricationMinutes,
    heat_treatment: mode.heatTreatmentMinutes,
    finishing: mode.finishingMinutes,
    glaze_firing: mode.glazeFiringMinutes ?? 0,
  };
  for (const k of ["fabrication", "finishing", ...(keys.includes("glaze_firing") ? ["glaze_firing" as const] : [])] as const) {
    const value = firstMinutes[k]!;
    if (!Number.isInteger(value) || value <= 0) throw new TimelineError(`The ${LABELS[k].toLowerCase()} minutes must be a whole number above zero.`);
  }

  let at = 0;
  const stages = keys.map((key) => {
    const minutes = firstMinutes[key] ?? minutesFor(stageMinutes, key, toothClass);
    const stage = { key, label: stageLabel(key, input), startMin: at, endMin: at + minutes, equipment: OCCUPIES[key] };
    at += minutes;
    return stage;
  });
  const chairFreeAtMin = Math.max(...stages.filter((s) => s.equipment.includes("chair")).map((s) => s.endMin));
  return { stages, totalMinutes: at, chairFreeAtMin };
}

/** A visit length as a patient reads it: the estimate (or the span of several) rounded out to quarter hours, as a range. */
export function visitLengthRange(totalMinutes: number, longestMinutes = totalMinutes, language: "en" | "fr" = "en"): { fromMinutes: number; toMinutes: number; text: string } {
  const fromMinutes = Math.max(15, Math.floor(totalMinutes / 15) * 15);
  const toMinutes = Math.ceil((Math.max(totalMinutes, longestMinutes) + 15) / 15) * 15;
  const hours = (m: number) => {
    const h = Math.floor(m / 60);
    const r = m % 60;
    if (h === 0) return `${r} min`;
    return r === 0 ? `${h} h` : `${h} h ${r} min`;
  };
  const text = language === "fr" ? `environ ${hours(fromMinutes)} à ${hours(toMinutes)}` : `about ${hours(fromMinutes)} to ${hours(toMinutes)}`;
  return { fromMinutes, toMinutes, text };
}
