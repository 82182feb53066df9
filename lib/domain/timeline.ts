// Visit timeline estimator: from material, finishing mode, tooth class and the clinic's stage
// minutes to the ordered stages, their offsets from the visit start, and what each occupies.
import type { FinishingKind, Fabrication, HeatTreatment, ResourceKind, StageKey, ToothClass } from "./types";

export type StageMinuteRow = { stage: string; toothClass: ToothClass | null; minutes: number };

export type TimelineInput = {
  material: { fabrication: Fabrication; heatTreatment: HeatTreatment };
  mode: { fabricationMinutes: number; heatTreatmentMinutes: number; finishing: FinishingKind; finishingMinutes: number };
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

/** Stages staff perform at the chair and their fixed order; fabrication-side stages are filled in from the material. */
const CLINIC_STAGES: StageKey[] = ["check_in", "anaesthesia", "preparation", "scan", "design", "try_in", "cementation", "aftercare"];

const LABELS: Record<StageKey, string> = {
  check_in: "Check-in",
  anaesthesia: "Anaesthesia",
  preparation: "Tooth preparation",
  scan: "Digital impression (scan)",
  design: "Crown design",
  fabrication: "Fabrication",
  heat_treatment: "Heat treatment",
  finishing: "Finishing",
  try_in: "Try-in",
  cementation: "Cementation",
  aftercare: "Aftercare briefing",
};

export function stageLabel(key: StageKey, input?: Pick<TimelineInput, "material" | "mode">): string {
  if (!input) return LABELS[key];
  if (key === "fabrication") return input.material.fabrication === "dry_milling" ? "Milling" : "Grinding";
  if (key === "heat_treatment") return input.material.heatTreatment === "sintering" ? "Sintering" : "Crystallisation firing";
  if (key === "finishing") return input.mode.finishing === "stain_glaze" ? "Stain and glaze" : "Polishing";
  return LABELS[key];
}

/** What each stage occupies. The patient stays in the chair until cementation ends; the
 *  aftercare briefing happens away from the chair. The dentist is free while the crown is
 *  being made, fired and finished, so they can work at another chair. */
const OCCUPIES: Record<StageKey, ResourceKind[]> = {
  check_in: ["chair"],
  anaesthesia: ["chair", "dentist"],
  preparation: ["chair", "dentist"],
  scan: ["chair", "dentist"],
  design: ["chair", "dentist"],
  fabrication: ["chair", "mill"],
  heat_treatment: ["chair", "furnace"],
  finishing: ["chair"],
  try_in: ["chair", "dentist"],
  cementation: ["chair", "dentist"],
  aftercare: [],
};

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
  const heats = material.heatTreatment !== "none";
  if (heats && mode.heatTreatmentMinutes <= 0) throw new TimelineError("A material that is heat-treated needs heat-treatment minutes for this mode.");
  if (!heats && mode.finishing === "stain_glaze") throw new TimelineError("Stain and glaze needs a firing; this material has no heat treatment, so it is polished.");
  for (const [name, value] of [["fabrication", mode.fabricationMinutes], ["finishing", mode.finishingMinutes]] as const) {
    if (!Number.isInteger(value) || value <= 0) throw new TimelineError(`The ${name} minutes must be a whole number above zero.`);
  }

  const durations: [StageKey, number][] = [];
  for (const key of CLINIC_STAGES) {
    if (key === "try_in") {
      durations.push(["fabrication", mode.fabricationMinutes]);
      if (heats) durations.push(["heat_treatment", mode.heatTreatmentMinutes]);
      durations.push(["finishing", mode.finishingMinutes]);
    }
    durations.push([key, minutesFor(stageMinutes, key, toothClass)]);
  }

  let at = 0;
  const stages = durations.map(([key, minutes]) => {
    const stage = { key, label: stageLabel(key, input), startMin: at, endMin: at + minutes, equipment: OCCUPIES[key] };
    at += minutes;
    return stage;
  });
  const chairFreeAtMin = Math.max(...stages.filter((s) => s.equipment.includes("chair")).map((s) => s.endMin));
  return { stages, totalMinutes: at, chairFreeAtMin };
}
