// The unpaid-hold release, on its own so the background worker can load it without the request-side
// modules (sessions, the payment SDK). Run by lib/jobs/deposit-release.ts; tests call it with their own "now".
import { QueryTypes } from "sequelize";
import { Appointment, Reservation, sequelize } from "@/db/models";
import { UNPAID_HOLD_MINUTES } from "@/lib/domain/money";
import { recordAudit } from "@/lib/server/audit";
import "@/lib/mail/hooks";

export const HOLD_RELEASED_REASON = `The deposit was not paid within ${UNPAID_HOLD_MINUTES} minutes of booking, so the time was released. You are welcome to book again.`;

/**
 * The job: unpaid bookings older than the hold let go of their equipment. The visit is cancelled
 * (the cancellation e-mail tells the patient why), its reservations turn inactive so the time is
 * offered again, and the deposit is marked released. `now` is a parameter so tests control time.
 */
export async function releaseUnpaidHolds(opts: { now?: Date; clinicId?: string } = {}): Promise<number> {
  const now = opts.now ?? new Date();
  const cutoff = new Date(now.getTime() - UNPAID_HOLD_MINUTES * 60_000);
  const due = await sequelize.query<{ id: string }>(
    `SELECT d.id FROM deposits d JOIN appointments a ON a.id = d.appointment_id
      WHERE d.status = 'due' AND d.created_at <= $1 AND a.status = 'requested' AND ($2::uuid IS NULL OR d.clinic_id = $2::uuid)
      ORDER BY d.created_at LIMIT 100`,
    { bind: [cutoff, opts.clinicId ?? null], type: QueryTypes.SELECT },
  );
  let released = 0;
  for (const { id } of due) {
    await sequelize.transaction(async (transaction) => {
      // SKIP LOCKED: a webhook marking this deposit paid right now wins, and two workers share the list.
      const [deposit] = await sequelize.query<{ id: string; clinicId: string; appointmentId: string }>(`SELECT id, clinic_id AS "clinicId", appointment_id AS "appointmentId" FROM deposits WHERE id = $1 AND status = 'due' AND created_at <= $2 FOR UPDATE SKIP LOCKED`, {
        bind: [id, cutoff], transaction, type: QueryTypes.SELECT,
      });
      if (!deposit) return;
      const visit = await Appointment.findByPk(deposit.appointmentId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!visit || visit.status !== "requested") return;
      await visit.update({ status: "cancelled", statusReason: HOLD_RELEASED_REASON }, { transaction });
      await Reservation.update({ active: false }, { where: { appointmentId: visit.id }, transaction });
      await sequelize.query(`UPDATE deposits SET status = 'released', closed_reason = 'Not paid in time.', updated_at = now() WHERE id = $1`, { bind: [deposit.id], transaction });
      await recordAudit({ clinicId: deposit.clinicId, actorUserId: null, action: "deposit.released", subjectType: "appointment", subjectId: visit.id, data: { depositId: deposit.id, holdMinutes: UNPAID_HOLD_MINUTES } }, transaction);
      await recordAudit({ clinicId: deposit.clinicId, actorUserId: null, action: "visit.cancelled", subjectType: "appointment", subjectId: visit.id, data: { from: "requested", to: "cancelled", reason: "deposit not paid in time" } }, transaction);
      released += 1;
    });
  }
  return released;
}
