// Writes messages into the mail outbox, always inside the caller's transaction.
//
// Why an outbox rather than pg-boss's `send({ db })` straight from the hook: the visit change and
// the row that says "send this" commit or roll back together, and the app process needs no job
// queue client at all. The worker moves due rows into pg-boss (in one transaction again), and
// pg-boss gives retries with backoff and safe hand-out to several workers. A reminder that waits
// for its time is a pending row, so moving or cancelling a visit just updates rows here.
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "@/db/sequelize";
import type { MailKind } from "@/db/models/mail";
import { idempotencyKey, planReminders, reminderKind } from "@/lib/domain/reminders";

export type OutboxInsert = {
  clinicId: string;
  appointmentId: string;
  kind: MailKind;
  visitStartsAt: Date;
  dueAt?: Date;
  hoursBefore?: number | null;
  /** Part of the idempotency key next to the visit and its start time; defaults to the kind. */
  keyKind?: string;
  state?: "pending" | "skipped";
  stateReason?: string | null;
  data?: Record<string, unknown>;
  attachment?: Buffer | null;
};

type Tx = Transaction | null | undefined;

export async function enqueueMail(rows: OutboxInsert[], transaction: Tx, now = new Date()): Promise<string[]> {
  if (!rows.length) return [];
  const values: unknown[] = [];
  const tuples = rows.map((r) => {
    const start = values.length;
    values.push(
      r.clinicId, r.appointmentId, r.kind, r.hoursBefore ?? null, r.visitStartsAt,
      idempotencyKey(r.appointmentId, r.keyKind ?? r.kind, r.visitStartsAt), r.dueAt ?? now,
      r.state ?? "pending", r.stateReason ?? null, JSON.stringify(r.data ?? {}), r.attachment ?? null,
    );
    const p = (i: number) => `$${start + i}`;
    return `(${p(1)}, ${p(2)}, ${p(3)}, ${p(4)}, ${p(5)}, ${p(6)}, ${p(7)}, ${p(8)}, ${p(9)}, ${p(10)}::jsonb, ${p(11)})`;
  });
  const inserted = await sequelize.query<{ id: string }>(
    `INSERT INTO mail_outbox (clinic_id, appointment_id, kind, hours_before, visit_starts_at, idempotency_key, due_at,
       state, state_reason, data, attachment)
     VALUES ${tuples.join(", ")} RETURNING id`,
    { bind: values, transaction: transaction ?? undefined, type: QueryTypes.SELECT },
  );
  return inserted.map((r) => r.id);
}

/** Reminders not sent yet are withdrawn (pending ones, and queued ones a retry has not delivered). */
export async function cancelReminders(appointmentId: string, reason: string, transaction: Tx): Promise<number> {
  const [, meta] = await sequelize.query(
    `UPDATE mail_outbox SET state = 'cancelled', state_reason = $2, updated_at = now()
      WHERE appointment_id = $1 AND kind = 'reminder' AND state IN ('pending', 'queued')`,
    { bind: [appointmentId, reason], transaction: transaction ?? undefined },
  );
  return (meta as { rowCount?: number })?.rowCount ?? 0;
}

export type VisitRef = { id: string; clinicId: string; startsAt: Date; remindersEnabled: boolean };

/** Rows for the clinic's reminder hours; those whose time has already passed are recorded as skipped. */
export async function reminderRows(visit: VisitRef, transaction: Tx, when: string, now = new Date()): Promise<OutboxInsert[]> {
  const [clinic] = await sequelize.query<{ hours: unknown }>(
    `SELECT settings->'reminderHoursBefore' AS hours FROM clinics WHERE id = $1`,
    { bind: [visit.clinicId], transaction: transaction ?? undefined, type: QueryTypes.SELECT },
  );
  return planReminders(visit.startsAt, clinic?.hours, now).map((plan) => ({
    clinicId: visit.clinicId,
    appointmentId: visit.id,
    kind: "reminder" as const,
    hoursBefore: plan.hoursBefore,
    keyKind: reminderKind(plan.hoursBefore),
    visitStartsAt: visit.startsAt,
    dueAt: plan.dueAt,
    state: plan.skip ? ("skipped" as const) : ("pending" as const),
    stateReason: plan.skip ? `Its time had already passed when ${when}.` : null,
  }));
}

/** How many calendar copies the patient already has: the next one's SEQUENCE (RFC 5545 §3.8.7.4). */
export async function nextCalendarSequence(appointmentId: string, transaction: Tx): Promise<number> {
  const [row] = await sequelize.query<{ n: string }>(
    `SELECT count(*) AS n FROM mail_outbox
      WHERE appointment_id = $1 AND kind IN ('visit_confirmed', 'visit_moved', 'visit_cancelled') AND (data->>'calendar')::boolean`,
    { bind: [appointmentId], transaction: transaction ?? undefined, type: QueryTypes.SELECT },
  );
  return Number(row?.n ?? 0);
}
