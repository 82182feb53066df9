// Treatment may not start before the consent is signed and reviewed: a model hook refuses moving
// a visit to in_progress or completed otherwise, whichever code path tries (instance or bulk update).
import { Op, type Transaction, type WhereOptions } from "sequelize";
import { AppError } from "@/lib/server/errors";
import { Appointment } from "./appointment";
import { Consent } from "./consent";

export const CONSENT_REQUIRED_MESSAGE = "Consent must be signed and reviewed before treatment starts.";
const TREATMENT_STATUSES = ["in_progress", "completed"];

async function assertReviewed(appointmentIds: string[], transaction?: Transaction | null) {
  if (appointmentIds.length === 0) return;
  const reviewed = await Consent.count({
    where: { appointmentId: { [Op.in]: appointmentIds }, status: "reviewed" },
    distinct: true,
    col: "appointment_id",
    transaction: transaction ?? undefined,
  });
  if (reviewed < new Set(appointmentIds).size) {
    throw new AppError(409, CONSENT_REQUIRED_MESSAGE, { code: "consent_required", field: "status" });
  }
}

export function registerConsentGuard() {
  Appointment.addHook("beforeUpdate", "consentGuard", async (visit: Appointment, options) => {
    if (!visit.changed("status") || !TREATMENT_STATUSES.includes(visit.status)) return;
    await assertReviewed([visit.id], options.transaction);
  });
  Appointment.addHook("beforeBulkUpdate", "consentGuardBulk", async (options) => {
    // Sequelize passes the new values on the options object, outside its declared type.
    const status = (options as { attributes?: { status?: unknown } }).attributes?.status;
    if (typeof status !== "string" || !TREATMENT_STATUSES.includes(status)) return;
    // With individualHooks the per-row hook above runs anyway.
    if (options.individualHooks) return;
    const rows = await Appointment.findAll({
      where: options.where as WhereOptions<Appointment>,
      attributes: ["id"],
      transaction: options.transaction ?? undefined,
    });
    await assertReviewed(rows.map((r) => r.id), options.transaction);
  });
}
