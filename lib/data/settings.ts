// The clinic manager's settings: opening hours and closed days, equipment, stage durations per
// stage and per material and mode, booking and reminder timing, staff accounts. Every write is
// admin-only, checked here as well as in the action, and audited in the same transaction.
import "server-only";
import { Op, UniqueConstraintError, type Transaction } from "sequelize";
import {
  Clinic, ClosedDay, Equipment, Material, MaterialMode, OpeningHour, StageDuration, User, sequelize,
} from "@/db/models";
import { hashPassword } from "@/lib/auth/password";
import type { SessionUser } from "@/lib/auth/session";
import { withDefaults } from "@/lib/domain/clinic-settings";
import type { ToothClass } from "@/lib/domain/types";
import {
  CLINIC_STAGE_KEYS, bookingSettingsSchema, closedDaySchema, equipmentSchema, materialModesSchema, newStaffSchema, openingHoursSchema,
  stageDurationsSchema, staffUpdateSchema, twoFactorRequirementSchema,
} from "@/lib/domain/settings-schemas";
import { rescheduleClinicReminders } from "@/lib/mail/reschedule";
import { recordAudit } from "@/lib/server/audit";
import { changeStaffAccess } from "./staff";
import { AppError, conflict, forbidden, notFound } from "@/lib/server/errors";

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

export async function clinicTimeZone({ clinicId }: { clinicId: string }): Promise<string> {
  const clinic = await Clinic.findByPk(clinicId, { attributes: ["timeZone"] });
  if (!clinic) throw notFound("That clinic");
  return clinic.timeZone;
}

// Reading ------------------------------------------------------------------------------------

export async function getHours({ clinicId }: { clinicId: string }) {
  const [hours, closed] = await Promise.all([
    OpeningHour.findAll({ where: { clinicId }, order: [["weekday", "ASC"], ["opens", "ASC"]] }),
    ClosedDay.findAll({ where: { clinicId }, order: [["day", "ASC"]] }),
  ]);
  return {
    hours: hours.map((h) => ({ weekday: h.weekday, opens: h.opens.slice(0, 5), closes: h.closes.slice(0, 5) })),
    closedDays: closed.map((c) => ({ id: Number(c.id), day: c.day, reason: c.reason })),
  };
}

export async function listEquipment({ clinicId }: { clinicId: string }) {
  const rows = await Equipment.findAll({ where: { clinicId }, order: [["kind", "ASC"], ["name", "ASC"]] });
  return rows.map((e) => ({ id: e.id, kind: e.kind, name: e.name, active: e.active }));
}

export async function getDurations({ clinicId }: { clinicId: string }) {
  const [rows, materials] = await Promise.all([
    StageDuration.findAll({ where: { clinicId }, order: [["stage", "ASC"], ["toothClass", "ASC"]] }),
    Material.findAll({ where: { clinicId }, include: [{ model: MaterialMode, as: "modes" }], order: [["sortOrder", "ASC"]] }),
  ]);
  const order = ["rapid", "standard", "refined"];
  return {
    stages: rows
      .filter((r) => (CLINIC_STAGE_KEYS as readonly string[]).includes(r.stage))
      .map((r) => ({ stage: r.stage as (typeof CLINIC_STAGE_KEYS)[number], toothClass: (r.toothClass ?? "") as "" | ToothClass, minutes: r.minutes })),
    materials: materials.map((m) => ({
      id: m.id, name: m.name, heatTreatment: m.heatTreatment, active: m.active,
      modes: [...(m.modes ?? [])].sort((a, b) => order.indexOf(a.mode) - order.indexOf(b.mode)).map((x) => ({
        id: Number(x.id), mode: x.mode, finishing: x.finishing,
        fabricationMinutes: x.fabricationMinutes, heatTreatmentMinutes: x.heatTreatmentMinutes, finishingMinutes: x.finishingMinutes,
      })),
    })),
  };
}

export async function getBookingSettings({ clinicId }: { clinicId: string }) {
  const clinic = await Clinic.findByPk(clinicId);
  if (!clinic) throw notFound("That clinic");
  return withDefaults(clinic.settings);
}

export async function listStaffAccounts({ clinicId }: { clinicId: string }) {
  const rows = await User.findAll({ where: { clinicId, role: { [Op.in]: ["reception", "dentist", "admin"] } }, order: [["name", "ASC"]] });
  return rows.map((u) => ({ id: u.id, name: u.name ?? "", email: u.email, role: u.role as "reception" | "dentist" | "admin", active: u.active }));
}

// Writing ------------------------------------------------------------------------------------

export async function saveOpeningHours(actor: Actor, input: unknown) {
  const clinicId = adminOf(actor);
  const { hours } = openingHoursSchema.parse(input);
  return audited(actor, "settings.opening_hours", { type: "clinic", id: clinicId }, async (transaction) => {
    const before = await OpeningHour.findAll({ where: { clinicId }, transaction });
    await OpeningHour.destroy({ where: { clinicId }, transaction });
    await OpeningHour.bulkCreate(hours.map((h) => ({ clinicId, ...h })), { transaction });
    return {
      result: hours.length,
      data: { before: before.map((h) => ({ weekday: h.weekday, opens: h.opens.slice(0, 5), closes: h.closes.slice(0, 5) })), after: hours },
    };
  });
}

export async function addClosedDay(actor: Actor, input: unknown) {
  const clinicId = adminOf(actor);
  const { day, reason } = closedDaySchema.parse(input);
  try {
    return await audited(actor, "settings.closed_day_added", { type: "clinic", id: clinicId }, async (transaction) => {
      const row = await ClosedDay.create({ clinicId, day, reason: reason || null }, { transaction });
      return { result: Number(row.id), data: { day, reason: reason || null } };
    });
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw conflict(`${day} is already a closed day.`);
    throw err;
  }
}

export async function removeClosedDay(actor: Actor, id: number) {
  const clinicId = adminOf(actor);
  return audited(actor, "settings.closed_day_removed", { type: "clinic", id: clinicId }, async (transaction) => {
    const row = await ClosedDay.findOne({ where: { id, clinicId }, transaction });
    if (!row) throw notFound("That closed day");
    await row.destroy({ transaction });
    return { result: true, data: { day: row.day, reason: row.reason } };
  });
}

export async function saveEquipment(actor: Actor, input: unknown) {
  const clinicId = adminOf(actor);
  const value = equipmentSchema.parse(input);
  try {
    return await audited(actor, value.id ? "settings.equipment_changed" : "settings.equipment_added", { type: "equipment", id: value.id ?? "new" }, async (transaction) => {
      if (!value.id) {
        const row = await Equipment.create({ clinicId, kind: value.kind, name: value.name, active: value.active }, { transaction });
        return { result: row.id, data: { id: row.id, kind: value.kind, name: value.name, active: value.active } };
      }
      const row = await Equipment.findOne({ where: { id: value.id, clinicId }, transaction });
      if (!row) throw notFound("That equipment");
      if (row.kind !== value.kind) throw new AppError(422, "A chair stays a chair: add a new item instead of changing its kind.", { field: "kind" });
      const before = { name: row.name, active: row.active };
      await row.update({ name: value.name, active: value.active }, { transaction });
      return { result: row.id, data: { id: row.id, before, after: { name: value.name, active: value.active } } };
    });
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw new AppError(409, `The clinic already has equipment called “${value.name}”.`, { field: "name" });
    throw err;
  }
}

export async function saveStageDurations(actor: Actor, input: unknown) {
  const clinicId = adminOf(actor);
  const { rows } = stageDurationsSchema.parse(input);
  return audited(actor, "settings.stage_durations", { type: "clinic", id: clinicId }, async (transaction) => {
    const before = await StageDuration.findAll({ where: { clinicId }, transaction });
    await StageDuration.destroy({ where: { clinicId }, transaction });
    await StageDuration.bulkCreate(rows.map((r) => ({ clinicId, stage: r.stage, toothClass: r.toothClass || null, minutes: r.minutes })), { transaction });
    return {
      result: rows.length,
      data: { before: before.map((b) => ({ stage: b.stage, toothClass: b.toothClass, minutes: b.minutes })), after: rows },
    };
  });
}

export async function saveMaterialModes(actor: Actor, input: unknown) {
  const clinicId = adminOf(actor);
  const { modes } = materialModesSchema.parse(input);
  return audited(actor, "settings.material_minutes", { type: "clinic", id: clinicId }, async (transaction) => {
    const rows = await MaterialMode.findAll({
      where: { id: { [Op.in]: modes.map((m) => m.id) } },
      include: [{ model: Material, where: { clinicId }, required: true }],
      transaction,
    });
    const changes: Record<string, unknown>[] = [];
    for (const m of modes) {
      const row = rows.find((r) => Number(r.id) === m.id);
      if (!row) throw notFound("That material mode");
      const material = (row as MaterialMode & { material?: Material }).material!;
      if (material.heatTreatment !== "none" && m.heatTreatmentMinutes <= 0) {
        throw new AppError(422, `${material.name} is heat-treated: its ${row.mode} mode needs heat-treatment minutes above zero.`, { field: `modes.${modes.indexOf(m)}.heatTreatmentMinutes` });
      }
      const heat = material.heatTreatment === "none" ? 0 : m.heatTreatmentMinutes;
      const next = { fabricationMinutes: m.fabricationMinutes, heatTreatmentMinutes: heat, finishingMinutes: m.finishingMinutes };
      const prev = { fabricationMinutes: row.fabricationMinutes, heatTreatmentMinutes: row.heatTreatmentMinutes, finishingMinutes: row.finishingMinutes };
      if (JSON.stringify(prev) !== JSON.stringify(next)) {
        await row.update(next, { transaction });
        changes.push({ material: material.key, mode: row.mode, before: prev, after: next });
      }
    }
    return { result: changes.length, data: { changes } };
  });
}

export async function saveBookingSettings(actor: Actor, input: unknown) {
  const clinicId = adminOf(actor);
  const value = bookingSettingsSchema.parse(input);
  return audited(actor, "settings.booking", { type: "clinic", id: clinicId }, async (transaction) => {
    const clinic = (await Clinic.findByPk(clinicId, { transaction, lock: transaction.LOCK.UPDATE }))!;
    const before = withDefaults(clinic.settings);
    await clinic.update({ settings: { ...clinic.settings, ...value } }, { transaction });
    // Reminders not sent yet follow the new timing, in the same transaction.
    const timingChanged = JSON.stringify(before.reminderHoursBefore) !== JSON.stringify(value.reminderHoursBefore);
    const reminders = timingChanged ? await rescheduleClinicReminders(clinicId, transaction) : null;
    return { result: value, data: { before, after: value, ...(reminders ? { reminders } : {}) } };
  });
}

export async function createStaffAccount(actor: Actor, input: unknown) {
  const clinicId = adminOf(actor);
  const value = newStaffSchema.parse(input);
  const passwordHash = await hashPassword(value.password);
  try {
    return await audited(actor, "settings.staff_added", { type: "user", id: "new" }, async (transaction) => {
      const row = await User.create({ email: value.email, name: value.name, role: value.role, clinicId, passwordHash, emailVerified: null }, { transaction });
      return { result: row.id, data: { userId: row.id, role: value.role } };
    });
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw new AppError(409, "An account with that e-mail already exists.", { field: "email" });
    throw err;
  }
}

/** The settings form's save: the same change as `PATCH /api/staff/:id` (lib/data/staff.ts). */
export async function updateStaffAccount(actor: Actor, input: unknown) {
  const value = staffUpdateSchema.parse(input);
  return changeStaffAccess(actor, value.id, { role: value.role, active: value.active });
}

/** Whether the clinic's staff must sign in with a one-time code as well as their password. */
export async function getTwoFactorRequirement({ clinicId }: { clinicId: string }): Promise<boolean> {
  const clinic = await Clinic.findByPk(clinicId, { attributes: ["requireTwoFactor"] });
  if (!clinic) throw notFound("That clinic");
  return clinic.requireTwoFactor;
}

/** Staff not yet enrolled are sent to enrolment on their next request once this is on. */
export async function saveTwoFactorRequirement(actor: Actor, input: unknown) {
  const clinicId = adminOf(actor);
  const value = twoFactorRequirementSchema.parse(input);
  return audited(actor, "settings.two_factor_requirement", { type: "clinic", id: clinicId }, async (transaction) => {
    const clinic = (await Clinic.findByPk(clinicId, { transaction, lock: transaction.LOCK.UPDATE }))!;
    const before = clinic.requireTwoFactor;
    await clinic.update({ requireTwoFactor: value.required }, { transaction });
    return { result: value.required, data: { before, after: value.required } };
  });
}
