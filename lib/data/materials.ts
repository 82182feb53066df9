// Data access for the clinic's material catalogue.
import "server-only";
import { Material, MaterialMode, StageDuration } from "@/db/models";
import { estimateTimeline, TimelineError } from "@/lib/domain/timeline";
import { TOOTH_CLASSES, type Mode, type ToothClass } from "@/lib/domain/types";

export async function listMaterials({ clinicId, activeOnly = true }: { clinicId: string; activeOnly?: boolean }) {
  const rows = await Material.findAll({
    where: activeOnly ? { clinicId, active: true } : { clinicId },
    include: [{ model: MaterialMode, as: "modes" }],
    order: [["sortOrder", "ASC"]],
  });
  return rows.map((m) => ({
    id: m.id,
    key: m.key,
    name: m.name,
    iso6872Class: m.iso6872Class,
    flexuralStrengthMpa: m.flexuralStrengthMpa,
    indications: { toothClasses: m.toothClasses, singleCrownOnly: true, provisionalOnly: m.provisionalOnly },
    cementation: m.cementation,
    fabrication: m.fabrication,
    heatTreatment: m.heatTreatment,
    minThicknessMm: m.minThicknessMm,
    description: m.description,
    pros: m.pros,
    cautions: m.cautions,
    modes: (m.modes ?? [])
      .slice()
      .sort((a, b) => ["rapid", "standard", "refined"].indexOf(a.mode) - ["rapid", "standard", "refined"].indexOf(b.mode))
      .map((x) => ({ mode: x.mode, fabricationMinutes: x.fabricationMinutes, heatTreatmentMinutes: x.heatTreatmentMinutes, finishing: x.finishing, finishingMinutes: x.finishingMinutes, glazeFiringMinutes: x.glazeFiringMinutes })),
  }));
}

export type MaterialView = Awaited<ReturnType<typeof listMaterials>>[number];

/** Estimated visit minutes per material, mode and tooth class (null where the plan cannot be made). */
export async function materialEstimates({ clinicId }: { clinicId: string }): Promise<Record<string, Partial<Record<Mode, Record<ToothClass, number | null>>>>> {
  const [materials, rows] = await Promise.all([
    Material.findAll({ where: { clinicId, active: true }, include: [{ model: MaterialMode, as: "modes" }] }),
    StageDuration.findAll({ where: { clinicId } }),
  ]);
  const stageMinutes = rows.map((r) => ({ stage: r.stage, toothClass: r.toothClass, minutes: r.minutes }));
  const out: Record<string, Partial<Record<Mode, Record<ToothClass, number | null>>>> = {};
  for (const m of materials) {
    out[m.id] = {};
    for (const mode of m.modes ?? []) {
      const byClass = {} as Record<ToothClass, number | null>;
      for (const toothClass of TOOTH_CLASSES) {
        try {
          byClass[toothClass] = estimateTimeline({ material: m, mode, toothClass, stageMinutes }).totalMinutes;
        } catch (err) {
          if (!(err instanceof TimelineError)) throw err;
          byClass[toothClass] = null;
        }
      }
      out[m.id][mode.mode] = byClass;
    }
  }
  return out;
}
