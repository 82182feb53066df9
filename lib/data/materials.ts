// Data access for the clinic's material catalogue.
import "server-only";
import { Equipment, FurnaceProgramme, Material, MaterialMode, sequelize, StageDuration } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { capableFurnaces, ProgrammeUnavailable, withProgrammeMinutes } from "@/lib/domain/furnace-programmes";
import { estimateTimeline, stagesFor, TimelineError } from "@/lib/domain/timeline";
import { materialTextsSchema } from "@/lib/domain/material-text-schemas";
import { TOOTH_CLASSES, type Mode, type ToothClass } from "@/lib/domain/types";
import { recordAudit } from "@/lib/server/audit";
import { forbidden, notFound } from "@/lib/server/errors";

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
    /** The clinic's list price in cents (null when the clinic has not priced it). */
    listFeeCents: m.listFeeCents ?? null,
    translations: m.translations,
    modes: (m.modes ?? [])
      .slice()
      .sort((a, b) => ["rapid", "standard", "refined"].indexOf(a.mode) - ["rapid", "standard", "refined"].indexOf(b.mode))
      .map((x) => ({ mode: x.mode, fabricationMinutes: x.fabricationMinutes, heatTreatmentMinutes: x.heatTreatmentMinutes, finishing: x.finishing, finishingMinutes: x.finishingMinutes, glazeFiringMinutes: x.glazeFiringMinutes })),
  }));
}

export type MaterialView = Awaited<ReturnType<typeof listMaterials>>[number];

export type ModeEstimate = { minutes: Record<ToothClass, number | null>; problem: string | null };

/** Estimated visit minutes per material, mode and tooth class, with the furnace programmes applied;
 *  `problem` says why a mode cannot be planned (then it is not offered). */
export async function materialEstimates({ clinicId }: { clinicId: string }): Promise<Record<string, Partial<Record<Mode, ModeEstimate>>>> {
  const [materials, rows, programmes, furnaces] = await Promise.all([
    Material.findAll({ where: { clinicId, active: true }, include: [{ model: MaterialMode, as: "modes" }] }),
    StageDuration.findAll({ where: { clinicId } }),
    FurnaceProgramme.findAll({ where: { clinicId } }),
    Equipment.findAll({ where: { clinicId, kind: "furnace", active: true } }),
  ]);
  const stageMinutes = rows.map((r) => ({ stage: r.stage, toothClass: r.toothClass, minutes: r.minutes }));
  const programme = (id: string | null) => programmes.find((p) => p.id === id) ?? null;
  const out: Record<string, Partial<Record<Mode, ModeEstimate>>> = {};
  for (const m of materials) {
    out[m.id] = {};
    for (const row of m.modes ?? []) {
      const choice = { heat: m.heatTreatment === "none" ? null : programme(row.heatProgrammeId), glaze: row.finishing === "stain_glaze" ? programme(row.glazeProgrammeId) : null };
      const mode = withProgrammeMinutes(row.get({ plain: true }), choice);
      const estimate: ModeEstimate = { minutes: { anterior: null, premolar: null, molar: null }, problem: null };
      try {
        for (const toothClass of TOOTH_CLASSES) estimate.minutes[toothClass] = estimateTimeline({ material: m, mode, toothClass, stageMinutes }).totalMinutes;
        const keys = new Set(stagesFor(m, mode));
        capableFurnaces(furnaces.map((f) => f.id), [keys.has("heat_treatment") ? choice.heat : null, keys.has("glaze_firing") ? choice.glaze : null]);
      } catch (err) {
        if (!(err instanceof TimelineError) && !(err instanceof ProgrammeUnavailable)) throw err;
        estimate.problem = err.message;
      }
      out[m.id][row.mode] = estimate;
    }
  }
  return out;
}

/** Every material of the clinic (offered or not) with its patient-facing texts in English and French. */
export async function listMaterialTexts({ clinicId }: { clinicId: string }) {
  const rows = await Material.findAll({ where: { clinicId }, order: [["sortOrder", "ASC"]] });
  return rows.map((m) => ({
    id: m.id,
    key: m.key,
    active: m.active,
    en: { name: m.name, description: m.description, pros: m.pros, cautions: m.cautions },
    fr: m.translations?.fr ?? null,
  }));
}

export type MaterialTextsActor = { user: SessionUser; ip?: string; userAgent?: string };

/** Saves a material's English and French texts: the clinic manager of the material's clinic only
 *  (another clinic's material is a 404), audited in the same transaction. */
export async function saveMaterialTexts(actor: MaterialTextsActor, input: unknown) {
  if (actor.user.role !== "admin" || !actor.user.clinicId) throw forbidden("Only the clinic manager can change material texts.");
  const clinicId = actor.user.clinicId;
  const value = materialTextsSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const material = await Material.findOne({ where: { id: value.materialId, clinicId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!material) throw notFound("That material");
    const before = { en: { name: material.name, description: material.description, pros: material.pros, cautions: material.cautions }, fr: material.translations?.fr ?? null };
    // A fresh object, so Sequelize sees the JSONB change; other languages kept as they were.
    const translations = { ...(material.translations ?? {}), fr: value.fr };
    await material.update({ ...value.en, translations }, { transaction });
    await recordAudit(
      {
        clinicId,
        actorUserId: actor.user.id,
        action: "settings.material_texts",
        subjectType: "material",
        subjectId: material.id,
        ip: actor.ip,
        userAgent: actor.userAgent,
        data: { material: material.key, before, after: { en: value.en, fr: value.fr } },
      },
      transaction,
    );
    return material.id;
  });
}
