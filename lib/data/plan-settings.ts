// The clinic manager's visit-plan settings: stage orders per material (kept within the safe rules),
// furnace programmes and the firings they are assigned to. Admin-only, audited in the same transaction.
import "server-only";
import { Op, UniqueConstraintError, type Transaction } from "sequelize";
import { Equipment, FurnaceProgramme, Material, MaterialMode, sequelize } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { firingAssignmentsSchema, furnaceProgrammeSchema, stageOrderSchema } from "@/lib/domain/plan-settings-schemas";
import { checkStageOrder, stagesFor, stageLabel } from "@/lib/domain/timeline";
import type { StageKey } from "@/lib/domain/types";
import { recordAudit } from "@/lib/server/audit";
import { AppError, forbidden, notFound } from "@/lib/server/errors";

export type Actor = { user: SessionUser; ip?: string; userAgent?: string };

function adminOf(actor: Actor): string {
  if (actor.user.role !== "admin" || !actor.user.clinicId) throw forbidden("Only the clinic manager can change settings.");
  return actor.user.clinicId;
}

async function audited<T>(actor: Actor, action: string, subject: { type: string; id: string }, work: (t: Transaction) => Promise<{ result: T; data: Record<string, unknown> }>) {
  return sequelize.transaction(async (transaction) => {
    const { result, data } = await work(transaction);
    await recordAudit(
      { clinicId: actor.user.clinicId, actorUserId: actor.user.id, action, subjectType: subject.type, subjectId: subject.id, ip: actor.ip, userAgent: actor.userAgent, data },
      transaction,
    );
    return result;
  });
}

export async function getPlanSettings({ clinicId }: { clinicId: string }) {
  const [materials, programmes, furnaces] = await Promise.all([
    Material.findAll({ where: { clinicId }, include: [{ model: MaterialMode, as: "modes" }], order: [["sortOrder", "ASC"]] }),
    FurnaceProgramme.findAll({ where: { clinicId }, order: [["name", "ASC"]] }),
    Equipment.findAll({ where: { clinicId, kind: "furnace" }, order: [["name", "ASC"]] }),
  ]);
  const modeOrder = ["rapid", "standard", "refined"];
  return {
    materials: materials.map((m) => ({
      id: m.id,
      name: m.name,
      heatTreatment: m.heatTreatment,
      active: m.active,
      stageOrder: m.stageOrder as StageKey[],
      labels: Object.fromEntries((m.stageOrder as StageKey[]).map((k) => [k, stageLabel(k, { material: m, mode: { finishing: "stain_glaze" } })])),
      modes: (m.modes ?? []).slice().sort((a, b) => modeOrder.indexOf(a.mode) - modeOrder.indexOf(b.mode)).map((x) => ({
        id: Number(x.id),
        mode: x.mode,
        finishing: x.finishing,
        heatProgrammeId: x.heatProgrammeId,
        glazeProgrammeId: x.glazeProgrammeId,
        glazeFiringMinutes: x.glazeFiringMinutes,
        hasGlazeFiring: stagesFor(m, x).includes("glaze_firing"),
      })),
    })),
    programmes: programmes.map((p) => ({ id: p.id, name: p.name, minutes: p.minutes, furnaceIds: p.furnaceIds })),
    furnaces: furnaces.map((f) => ({ id: f.id, name: f.name, active: f.active })),
  };
}

export async function saveStageOrder(actor: Actor, input: unknown) {
  const clinicId = adminOf(actor);
  const value = stageOrderSchema.parse(input);
  return audited(actor, "settings.stage_order", { type: "material", id: value.materialId }, async (transaction) => {
    const material = await Material.findOne({ where: { id: value.materialId, clinicId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!material) throw notFound("That material");
    const problems = checkStageOrder(value.order, material);
    if (problems.length) throw new AppError(422, `${material.name}: ${problems.join(" ")}`, { field: "order" });
    const before = material.stageOrder;
    await material.update({ stageOrder: value.order }, { transaction });
    return { result: material.id, data: { material: material.key, before, after: value.order } };
  });
}

async function assertFurnaces(clinicId: string, ids: string[], transaction: Transaction) {
  if (!ids.length) return;
  const found = await Equipment.count({ where: { id: { [Op.in]: ids }, clinicId, kind: "furnace" }, transaction });
  if (found !== new Set(ids).size) throw new AppError(422, "Choose furnaces of this clinic.", { field: "furnaceIds" });
}

export async function saveFurnaceProgramme(actor: Actor, input: unknown) {
  const clinicId = adminOf(actor);
  const value = furnaceProgrammeSchema.parse(input);
  const furnaceIds = [...new Set(value.furnaceIds)];
  try {
    return await audited(actor, value.id ? "settings.furnace_programme_changed" : "settings.furnace_programme_added", { type: "furnace_programme", id: value.id ?? "new" }, async (transaction) => {
      await assertFurnaces(clinicId, furnaceIds, transaction);
      if (!value.id) {
        const row = await FurnaceProgramme.create({ clinicId, name: value.name, minutes: value.minutes, furnaceIds }, { transaction });
        return { result: row.id, data: { id: row.id, name: value.name, minutes: value.minutes, furnaceIds } };
      }
      const row = await FurnaceProgramme.findOne({ where: { id: value.id, clinicId }, transaction });
      if (!row) throw notFound("That programme");
      const before = { name: row.name, minutes: row.minutes, furnaceIds: row.furnaceIds };
      await row.update({ name: value.name, minutes: value.minutes, furnaceIds }, { transaction });
      return { result: row.id, data: { id: row.id, before, after: { name: value.name, minutes: value.minutes, furnaceIds } } };
    });
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw new AppError(409, `The clinic already has a programme called “${value.name}”.`, { field: "name" });
    throw err;
  }
}

export async function deleteFurnaceProgramme(actor: Actor, id: string) {
  const clinicId = adminOf(actor);
  return audited(actor, "settings.furnace_programme_removed", { type: "furnace_programme", id }, async (transaction) => {
    const row = /^[0-9a-f-]{36}$/i.test(id) ? await FurnaceProgramme.findOne({ where: { id, clinicId }, transaction }) : null;
    if (!row) throw notFound("That programme");
    const data = { id: row.id, name: row.name, minutes: row.minutes, furnaceIds: row.furnaceIds };
    // Firings that used it go back to "any furnace, the mode's own minutes" (ON DELETE SET NULL).
    await row.destroy({ transaction });
    return { result: id, data };
  });
}

export async function saveFiringAssignments(actor: Actor, input: unknown) {
  const clinicId = adminOf(actor);
  const { modes } = firingAssignmentsSchema.parse(input);
  return audited(actor, "settings.firing_programmes", { type: "clinic", id: clinicId }, async (transaction) => {
    const rows = await MaterialMode.findAll({
      where: { id: { [Op.in]: modes.map((m) => m.id) } },
      include: [{ model: Material, where: { clinicId }, required: true }],
      transaction,
    });
    const ids = [...new Set(modes.flatMap((m) => [m.heatProgrammeId, m.glazeProgrammeId]).filter((x): x is string => !!x))];
    const known = ids.length ? await FurnaceProgramme.count({ where: { id: { [Op.in]: ids }, clinicId }, transaction }) : 0;
    if (known !== ids.length) throw new AppError(422, "Choose programmes of this clinic.", { field: "modes" });
    const changes: Record<string, unknown>[] = [];
    for (const [i, m] of modes.entries()) {
      const row = rows.find((r) => Number(r.id) === m.id);
      if (!row) throw notFound("That material mode");
      const material = (row as MaterialMode & { material?: Material }).material!;
      const glazes = stagesFor(material, row).includes("glaze_firing");
      if (glazes && !m.glazeProgrammeId && m.glazeFiringMinutes <= 0) {
        throw new AppError(422, `${material.name}, ${row.mode}: a stain-and-glaze finish is fired; give the glaze firing minutes or a programme.`, { field: `modes.${i}.glazeFiringMinutes` });
      }
      const next = {
        heatProgrammeId: material.heatTreatment === "none" ? null : m.heatProgrammeId,
        glazeProgrammeId: m.glazeProgrammeId,
        glazeFiringMinutes: m.glazeFiringMinutes,
      };
      const prev = { heatProgrammeId: row.heatProgrammeId, glazeProgrammeId: row.glazeProgrammeId, glazeFiringMinutes: row.glazeFiringMinutes };
      if (JSON.stringify(prev) !== JSON.stringify(next)) {
        await row.update(next, { transaction });
        changes.push({ material: material.key, mode: row.mode, before: prev, after: next });
      }
    }
    return { result: changes.length, data: { changes } };
  });
}
