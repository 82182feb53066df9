// Data access for the clinic's material catalogue.
import "server-only";
import { Material, MaterialMode } from "@/db/models";

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
    translations: m.translations,
    modes: (m.modes ?? [])
      .slice()
      .sort((a, b) => ["rapid", "standard", "refined"].indexOf(a.mode) - ["rapid", "standard", "refined"].indexOf(b.mode))
      .map((x) => ({ mode: x.mode, fabricationMinutes: x.fabricationMinutes, heatTreatmentMinutes: x.heatTreatmentMinutes, finishing: x.finishing, finishingMinutes: x.finishingMinutes })),
  }));
}

export type MaterialView = Awaited<ReturnType<typeof listMaterials>>[number];
