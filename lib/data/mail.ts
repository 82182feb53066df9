// Data access for visit e-mail: reception's delivery log, and turning a visit's reminders off or on
// (by the signed-in patient, or through the signed link in a reminder e-mail).
import "server-only";
import { Appointment, Clinic, MailAttempt, MailOutbox, sequelize } from "@/db/models";
import type { MailKind, OutboxState } from "@/db/models/mail";
import type { SessionUser } from "@/lib/auth/session";
import { findVisitFor } from "@/lib/booking/transitions";
import { linkMatchesVisit, verifyReminderToken } from "@/lib/mail/reminder-token";
import { recordAudit } from "@/lib/server/audit";
import { conflict, forbidden, notFound } from "@/lib/server/errors";
import "@/lib/mail/hooks";

export type DeliveryStatus = "scheduled" | "sending" | "sent" | "retrying" | "failed" | "skipped" | "withdrawn";

export type DeliveryLogEntry = {
  id: string;
  kind: MailKind;
  label: string;
  status: DeliveryStatus;
  dueAt: Date;
  note: string | null;
  lastAt: Date | null;
  attempts: { attempt: number; outcome: string; detail: string | null; at: Date }[];
};

const LABELS: Record<MailKind, string> = {
  visit_requested: "Request received",
  visit_confirmed: "Confirmation with calendar file",
  visit_moved: "New time",
  visit_declined: "Request declined",
  visit_cancelled: "Cancellation",
  reminder: "Reminder",
  aftercare: "Aftercare advice",
  consent_copy: "Consent copy (PDF)",
  deposit_paid: "Deposit receipt",
  deposit_refunded: "Deposit refund receipt",
};

function statusOf(state: OutboxState, dueAt: Date, lastOutcome: string | undefined, now: Date): DeliveryStatus {
  switch (state) {
    case "sent": return "sent";
    case "failed": return "failed";
    case "skipped": return "skipped";
    case "cancelled": return "withdrawn";
    case "queued": return lastOutcome === "retrying" ? "retrying" : "sending";
    default: return dueAt.getTime() > now.getTime() ? "scheduled" : "sending";
  }
}

/** Every message about one visit, newest first, with its attempts. Staff of the visit's clinic only. */
export async function getDeliveryLog({ user, appointmentId, now = new Date() }: { user: SessionUser; appointmentId: string; now?: Date }) {
  if (user.role === "patient") throw forbidden();
  const visit = await findVisitFor({ user }, appointmentId);
  const [clinic, rows, attempts] = await Promise.all([
    Clinic.findByPk(visit.clinicId, { attributes: ["timeZone"] }),
    MailOutbox.findAll({
      where: { appointmentId: visit.id },
      attributes: { exclude: ["attachment"] },
      order: [["dueAt", "DESC"], ["createdAt", "DESC"]],
    }),
    MailAttempt.findAll({ where: { appointmentId: visit.id }, order: [["at", "ASC"], ["id", "ASC"]] }),
  ]);
  const byOutbox = new Map<string, MailAttempt[]>();
  for (const a of attempts) byOutbox.set(a.outboxId, [...(byOutbox.get(a.outboxId) ?? []), a]);
  const entries: DeliveryLogEntry[] = rows.map((r) => {
    const tries = byOutbox.get(r.id) ?? [];
    const last = tries.at(-1);
    return {
      id: r.id,
      kind: r.kind,
      label: r.kind === "reminder" ? `${LABELS.reminder}, ${r.hoursBefore} h before` : LABELS[r.kind],
      status: statusOf(r.state, r.dueAt, last?.outcome, now),
      dueAt: r.dueAt,
      note: last?.detail ?? r.stateReason ?? null,
      lastAt: last?.at ?? null,
      attempts: tries.map((a) => ({ attempt: a.attempt, outcome: a.outcome, detail: a.detail, at: a.at })),
    };
  });
  return { remindersEnabled: visit.remindersEnabled, timeZone: clinic?.timeZone ?? "UTC", entries };
}

type ChangeInfo = { ip?: string | null; userAgent?: string | null };

async function setReminders(
  appointmentId: string,
  enabled: boolean,
  actorUserId: string | null,
  via: string,
  info: ChangeInfo,
  accept: (visit: Appointment) => boolean = () => true,
) {
  return sequelize.transaction(async (transaction) => {
    const visit = await Appointment.findByPk(appointmentId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!visit || !accept(visit)) throw notFound("That visit");
    if (visit.remindersEnabled === enabled) return visit;
    if (enabled && !["requested", "confirmed"].includes(visit.status)) {
      throw conflict(`This visit is ${visit.status.replace("_", " ")}, so there is nothing to remind you of.`);
    }
    // The model hook withdraws or schedules the reminders in this same transaction.
    await visit.update({ remindersEnabled: enabled }, { transaction });
    await recordAudit(
      {
        clinicId: visit.clinicId, actorUserId, action: enabled ? "visit.reminders_on" : "visit.reminders_off",
        subjectType: "appointment", subjectId: visit.id, ip: info.ip, userAgent: info.userAgent, data: { via },
      },
      transaction,
    );
    return visit;
  });
}

/** The signed-in patient turns reminders for their own visit off or on; anyone else's visit is a 404. */
export async function setVisitReminders({ user, appointmentId, enabled, ...info }: { user: SessionUser; appointmentId: string; enabled: boolean } & ChangeInfo) {
  if (user.role !== "patient") throw forbidden("Only the patient can change their reminders.");
  const visit = await findVisitFor({ user }, appointmentId);
  const updated = await setReminders(visit.id, enabled, user.id, "visit page", info);
  return { remindersEnabled: updated.remindersEnabled };
}

/** Through the link in a reminder e-mail: the signed token stands in for a session. */
export async function setRemindersByToken({ token, enabled, ...info }: { token: string; enabled: boolean } & ChangeInfo) {
  const verified = verifyReminderToken(token);
  if (!verified) throw notFound("That link");
  // A link sent before the visit moved was replaced by the one in the newer e-mail.
  const updated = await setReminders(verified.id, enabled, null, "e-mail link", info, (visit) => linkMatchesVisit(verified, visit));
  return { remindersEnabled: updated.remindersEnabled };
}

/** What the link page shows: the clinic, the visit time and whether reminders are on. Null for a bad, expired or replaced link. */
export async function visitForReminderToken(token: string) {
  const verified = verifyReminderToken(token);
  if (!verified) return null;
  const visit = await Appointment.findByPk(verified.id, { attributes: ["id", "clinicId", "startsAt", "endsAt", "status", "remindersEnabled"] });
  if (!visit || !linkMatchesVisit(verified, visit)) return null;
  const clinic = await Clinic.findByPk(visit.clinicId, { attributes: ["name", "timeZone", "phone"] });
  // Reminders can only be turned back on for a visit still to come.
  const upcoming = ["requested", "confirmed"].includes(visit.status) && visit.startsAt.getTime() > Date.now();
  return { visit, clinic: clinic!, upcoming };
}
