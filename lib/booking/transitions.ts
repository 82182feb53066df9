// Visit state changes by reception and patients. Each change and its audit event share a
// transaction; declined and cancelled visits release their reservations.
import { Appointment, Clinic, Reservation, sequelize } from "@/db/models";
import { assertCanSee } from "@/lib/data/access";
import { withDefaults } from "@/lib/domain/clinic-settings";
import type { AppointmentStatus } from "@/lib/domain/types";
import { settleDepositAfterEnd } from "@/lib/payments/deposits";
import { recordAudit } from "@/lib/server/audit";
import { conflict, forbidden, notFound } from "@/lib/server/errors";
import { rescheduleVisit, type Actor } from "./book";
import "@/lib/mail/hooks";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The visit if this user may see it; 404 otherwise (also for malformed ids). */
export async function findVisitFor(actor: Actor, id: string): Promise<Appointment> {
  const row = UUID.test(id) ? await Appointment.findByPk(id) : null;
  await assertCanSee(actor.user, row, "That visit");
  return row!;
}

async function change(actor: Actor, id: string, from: AppointmentStatus[], to: AppointmentStatus, action: string, reason?: string) {
  const visit = await findVisitFor(actor, id);
  return sequelize.transaction(async (transaction) => {
    const fresh = (await Appointment.findByPk(visit.id, { transaction, lock: transaction.LOCK.UPDATE }))!;
    if (!from.includes(fresh.status)) {
      throw conflict(`This visit is ${fresh.status.replace("_", " ")}, so it cannot be ${to === "confirmed" ? "confirmed" : to}.`);
    }
    const previous = fresh.status;
    await fresh.update({ status: to, statusReason: reason ?? null }, { transaction });
    if (to === "declined" || to === "cancelled" || to === "no_show") {
      await Reservation.update({ active: false }, { where: { appointmentId: fresh.id }, transaction });
    }
    await recordAudit(
      { clinicId: fresh.clinicId, actorUserId: actor.user.id, action, subjectType: "appointment", subjectId: fresh.id, ip: actor.ip, userAgent: actor.userAgent, data: { from: previous, to, ...(reason ? { reason } : {}) } },
      transaction,
    );
    return fresh;
  });
}

/** Deposit follow-up once the visit's end is committed; a payment-service outage must not undo the decline. */
async function settleDeposit(actor: Actor, visit: Appointment, to: "declined" | "cancelled", now = new Date()) {
  try {
    await settleDepositAfterEnd({ appointment: visit, to, byPatient: actor.user.role === "patient", actorUserId: actor.user.id, now });
  } catch (err) {
    console.error(`Deposit follow-up failed for visit ${visit.id}: ${err instanceof Error ? err.name : "error"}`);
  }
}

export async function confirmVisit(actor: Actor, id: string) {
  if (!["reception", "admin"].includes(actor.user.role)) throw forbidden("Only reception or the clinic manager can confirm visits.");
  return change(actor, id, ["requested"], "confirmed", "visit.confirmed");
}

export async function declineVisit(actor: Actor, id: string, reason: string) {
  if (!["reception", "admin"].includes(actor.user.role)) throw forbidden("Only reception or the clinic manager can decline visits.");
  const visit = await change(actor, id, ["requested"], "declined", "visit.declined", reason);
  await settleDeposit(actor, visit, "declined");
  return visit;
}

/** Whether a patient may still change a visit online (before the clinic's cut-off). */
export function patientMayChange(visit: Pick<Appointment, "status" | "startsAt">, cancelCutoffHours: number, now = new Date()): boolean {
  return ["requested", "confirmed"].includes(visit.status) && visit.startsAt.getTime() - now.getTime() >= cancelCutoffHours * 3_600_000;
}

/** Patients may cancel or move their own visit up to the clinic's cut-off; staff at any time before it starts. */
async function assertPatientMayChange(actor: Actor, visit: Appointment, now: Date) {
  if (actor.user.role !== "patient") return;
  const clinic = await Clinic.findByPk(visit.clinicId);
  if (!clinic) throw notFound("That clinic");
  const { cancelCutoffHours } = withDefaults(clinic.settings);
  if (!patientMayChange(visit, cancelCutoffHours, now)) {
    throw conflict(`Changes online close ${cancelCutoffHours} hours before the visit. Please call the clinic${clinic.phone ? ` on ${clinic.phone}` : ""}.`);
  }
}

export async function cancelVisit(actor: Actor, id: string, reason?: string, now = new Date()) {
  const visit = await findVisitFor(actor, id);
  await assertPatientMayChange(actor, visit, now);
  if (actor.user.role === "dentist") throw forbidden("Reception handles cancellations.");
  const cancelled = await change(actor, id, ["requested", "confirmed"], "cancelled", "visit.cancelled", reason);
  // A patient's deposit comes back only before the clinic's refund cut-off (told before confirming).
  await settleDeposit(actor, cancelled, "cancelled", now);
  return cancelled;
}

export async function moveVisit(actor: Actor, id: string, start: Date, now = new Date()) {
  const visit = await findVisitFor(actor, id);
  if (actor.user.role === "dentist") throw forbidden("Reception handles moving visits.");
  await assertPatientMayChange(actor, visit, now);
  // A patient's move needs reception's confirmation again; reception's move keeps the status.
  return rescheduleVisit({ appointment: visit, start, actor, now, status: actor.user.role === "patient" ? "requested" : undefined });
}
