// Staff record a consent withdrawal the patient made by phone, in person or in writing. The same
// rules as the patient's own withdrawal (signed, not yet withdrawn, before the visit starts), plus
// who made it, how and when; the change and its audit event share one transaction.
import "server-only";
import { Appointment, Clinic, Consent, sequelize } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { staffWithdrawalSchema } from "@/lib/domain/consent-withdrawal";
import { zonedTime } from "@/lib/domain/time-zone";
import { recordAudit } from "@/lib/server/audit";
import { AppError, conflict, forbidden, notFound } from "@/lib/server/errors";

const STAFF = ["reception", "dentist", "admin"];
const OPEN = ["requested", "confirmed", "checked_in"];

export async function recordWithdrawalForPatient(opts: { user: SessionUser; input: unknown; ip?: string; userAgent?: string; now?: Date }) {
  const { user } = opts;
  if (!STAFF.includes(user.role) || !user.clinicId) throw forbidden("Only clinic staff can record a withdrawal for a patient.");
  const value = staffWithdrawalSchema.parse(opts.input);
  const now = opts.now ?? new Date();
  return sequelize.transaction(async (t) => {
    const consent = await Consent.findOne({ where: { id: value.consentId, clinicId: user.clinicId! }, transaction: t, lock: t.LOCK.UPDATE });
    if (!consent) throw notFound("That consent");
    if (consent.status === "withdrawn") throw conflict("This consent is already withdrawn.");
    if (consent.status === "pending") throw conflict("This consent is not signed yet, so there is nothing to withdraw.");
    const visit = (await Appointment.findByPk(consent.appointmentId, { transaction: t, lock: t.LOCK.UPDATE }))!;
    const clinic = (await Clinic.findByPk(consent.clinicId, { transaction: t }))!;
    const at = zonedTime(value.date, value.time, clinic.timeZone);
    if (at.getTime() > now.getTime()) throw new AppError(422, "The withdrawal cannot be later than now.", { field: "time" });
    if (consent.signedAt && at.getTime() < consent.signedAt.getTime()) throw new AppError(422, "The withdrawal cannot be before the consent was signed.", { field: "time" });
    // Until treatment starts: a patient may also change their mind at the front desk after checking in.
    if (!OPEN.includes(visit.status)) {
      throw conflict("Treatment has started or the visit is over: a withdrawal is handled by the dentist with the patient.");
    }
    await consent.update(
      { status: "withdrawn", withdrawnAt: at, withdrawnBy: user.id, withdrawnReason: value.reason || null, withdrawnVia: value.via, withdrawnByName: value.byName },
      { transaction: t },
    );
    await recordAudit(
      {
        clinicId: consent.clinicId, actorUserId: user.id, action: "consent.withdrawn", subjectType: "consent", subjectId: consent.id, ip: opts.ip, userAgent: opts.userAgent,
        data: { appointmentId: consent.appointmentId, recordedForPatient: true, via: value.via, byName: value.byName, at: at.toISOString() },
      },
      t,
    );
    return { id: consent.id, withdrawnAt: at, appointmentId: consent.appointmentId };
  });
}
