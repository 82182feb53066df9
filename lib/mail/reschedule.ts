// When the clinic changes its reminder timing, the reminders not sent yet follow: reminders at hours
// no longer wanted are cancelled, reminders at new hours are added (recorded as skipped when their
// time has already passed), and reminders at unchanged hours stay as they are. Runs in the caller's
// transaction, so the settings change and the outbox change commit together.
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "@/db/sequelize";
import { reminderHours } from "@/lib/domain/reminders";
import { enqueueMail, reminderRows } from "./outbox";

export async function rescheduleClinicReminders(clinicId: string, transaction: Transaction, now = new Date()): Promise<{ cancelled: number; added: number }> {
  const [clinic] = await sequelize.query<{ hours: unknown }>(`SELECT settings->'reminderHoursBefore' AS hours FROM clinics WHERE id = $1`, {
    bind: [clinicId], transaction, type: QueryTypes.SELECT,
  });
  const wanted = reminderHours(clinic?.hours);
  // Confirmed visits still ahead whose patient wants reminders (the same visits the hooks plan for).
  const visits = await sequelize.query<{ id: string; starts_at: Date }>(
    `SELECT id, starts_at FROM appointments WHERE clinic_id = $1 AND status = 'confirmed' AND reminders_enabled AND starts_at > $2`,
    { bind: [clinicId, now], transaction, type: QueryTypes.SELECT },
  );
  if (!visits.length) return { cancelled: 0, added: 0 };
  const ids = visits.map((v) => v.id);

  const [, meta] = await sequelize.query(
    `UPDATE mail_outbox o SET state = 'cancelled', state_reason = 'The clinic changed its reminder timing.', updated_at = now()
       FROM appointments a
      WHERE o.appointment_id = a.id AND a.id = ANY($1::uuid[]) AND o.kind = 'reminder' AND o.visit_starts_at = a.starts_at
        AND o.state IN ('pending', 'queued') AND NOT (o.hours_before = ANY($2::int[]))`,
    { bind: [ids, wanted], transaction },
  );
  const cancelled = (meta as { rowCount?: number })?.rowCount ?? 0;

  // Hours a visit already has a live or delivered reminder for are left alone.
  const have = await sequelize.query<{ appointment_id: string; hours_before: number }>(
    `SELECT o.appointment_id, o.hours_before FROM mail_outbox o JOIN appointments a ON a.id = o.appointment_id
      WHERE a.id = ANY($1::uuid[]) AND o.kind = 'reminder' AND o.visit_starts_at = a.starts_at AND o.state IN ('pending', 'queued', 'sent')`,
    { bind: [ids], transaction, type: QueryTypes.SELECT },
  );
  const taken = new Set(have.map((h) => `${h.appointment_id}/${h.hours_before}`));
  const rows = [];
  for (const v of visits) {
    const planned = await reminderRows({ id: v.id, clinicId, startsAt: new Date(v.starts_at), remindersEnabled: true }, transaction, "the clinic changed its reminder timing", now);
    rows.push(...planned.filter((r) => !taken.has(`${v.id}/${r.hoursBefore}`)));
  }
  await enqueueMail(rows, transaction, now);
  return { cancelled, added: rows.filter((r) => r.state !== "skipped").length };
}
