// Data access for clinic staff accounts: listing them, and the clinic manager's changes to who
// can sign in (shared by `PATCH /api/staff/:id` and the settings page).
import "server-only";
import { Op } from "sequelize";
import { User, sequelize } from "@/db/models";
import type { Role } from "@/db/models/user";
import { bumpSessionVersion } from "@/lib/auth/account";
import type { SessionUser } from "@/lib/auth/session";
import { staffAccessSchema } from "@/lib/domain/settings-schemas";
import { recordAudit } from "@/lib/server/audit";
import { AppError, forbidden, notFound } from "@/lib/server/errors";

const STAFF: Role[] = ["reception", "dentist", "admin"];

export type StaffActor = { user: SessionUser; ip?: string; userAgent?: string };

export async function listStaff({ clinicId }: { clinicId: string }) {
  const rows = await User.findAll({
    where: { clinicId, role: { [Op.in]: STAFF } },
    order: [["role", "ASC"], ["name", "ASC"]],
  });
  return rows.map((u) => ({ id: u.id, name: u.name, email: u.email, role: u.role, active: u.active }));
}

function managerOf(actor: StaffActor): string {
  if (actor.user.role !== "admin" || !actor.user.clinicId) throw forbidden("Only the clinic manager can change staff accounts.");
  return actor.user.clinicId;
}

/**
 * Turns a staff account on or off and/or changes its role. Any real change ends the account's
 * open sessions (its session version moves on), in the same transaction as the audit event.
 * Another clinic's account is "not found"; the last active clinic manager cannot be turned off
 * or demoted (409), whoever asks.
 */
export async function changeStaffAccess(actor: StaffActor, staffId: string, input: unknown) {
  const clinicId = managerOf(actor);
  const value = staffAccessSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const isUuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(staffId);
    const row = isUuid
      ? await User.findOne({ where: { id: staffId, clinicId, role: { [Op.in]: STAFF } }, transaction, lock: transaction.LOCK.UPDATE })
      : null;
    if (!row) throw notFound("That staff account");
    const after = { role: value.role ?? row.role, active: value.active ?? row.active };
    const before = { role: row.role, active: row.active };
    if (row.role === "admin" && row.active && (after.role !== "admin" || !after.active)) {
      // Lock the clinic's managers so two managers cannot demote each other at the same moment.
      const admins = await User.findAll({ where: { clinicId, role: "admin", active: true }, transaction, lock: transaction.LOCK.UPDATE, attributes: ["id"] });
      if (admins.filter((a) => a.id !== row.id).length === 0) {
        throw new AppError(409, "The clinic needs at least one active clinic manager: make someone else manager first.", { field: value.role !== undefined ? "role" : "active", code: "last_manager" });
      }
    }
    const changed = before.role !== after.role || before.active !== after.active;
    if (changed) {
      await row.update(after, { transaction });
      await bumpSessionVersion(row.id, transaction);
    }
    await recordAudit(
      { clinicId, actorUserId: actor.user.id, action: "settings.staff_changed", subjectType: "user", subjectId: row.id, ip: actor.ip, userAgent: actor.userAgent, data: { before, after, sessionsEnded: changed } },
      transaction,
    );
    return { id: row.id, role: after.role, active: after.active };
  });
}

/** The clinic manager ends every open session of one staff member (they sign in again). */
export async function endStaffSessions(actor: StaffActor, staffId: string) {
  const clinicId = managerOf(actor);
  return sequelize.transaction(async (transaction) => {
    const isUuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(staffId);
    const row = isUuid ? await User.findOne({ where: { id: staffId, clinicId, role: { [Op.in]: STAFF } }, transaction, attributes: ["id"] }) : null;
    if (!row) throw notFound("That staff account");
    await bumpSessionVersion(row.id, transaction);
    await recordAudit(
      { clinicId, actorUserId: actor.user.id, action: "settings.staff_sessions_ended", subjectType: "user", subjectId: row.id, ip: actor.ip, userAgent: actor.userAgent },
      transaction,
    );
  });
}
