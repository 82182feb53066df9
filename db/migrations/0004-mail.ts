// E-mail that never gets lost: the outbox the visit hooks write in the visit's own transaction,
// the idempotency keys that stop a message going out twice, and the log of every attempt.
// The job queue itself (pg-boss) keeps its jobs in its own `pgboss` schema, created by the worker.
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    -- One row per message to send. pending → queued (a pg-boss job exists) → sent | skipped | failed;
    -- cancelled when a visit moves or ends before a reminder was due.
    CREATE TABLE mail_outbox (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE CASCADE,
      appointment_id uuid NOT NULL REFERENCES appointments(id) ON DELETE CASCADE,
      kind text NOT NULL CHECK (kind IN ('visit_requested', 'visit_confirmed', 'visit_moved', 'visit_declined',
        'visit_cancelled', 'reminder', 'aftercare', 'consent_copy')),
      hours_before smallint CHECK (hours_before > 0),
      visit_starts_at timestamptz NOT NULL,
      idempotency_key text NOT NULL,
      due_at timestamptz NOT NULL,
      state text NOT NULL DEFAULT 'pending' CHECK (state IN ('pending', 'queued', 'sent', 'skipped', 'failed', 'cancelled')),
      state_reason text,
      job_id uuid,
      data jsonb NOT NULL DEFAULT '{}'::jsonb,
      attachment bytea,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((kind = 'reminder') = (hours_before IS NOT NULL))
    );
    CREATE INDEX mail_outbox_due ON mail_outbox (due_at) WHERE state = 'pending';
    CREATE INDEX mail_outbox_appointment ON mail_outbox (appointment_id, created_at);

    -- The unique key is claimed before a message goes to SMTP, so two workers (or a retried job)
    -- can never both send it. A claim that is still 'sending' after its lease was abandoned by a crash.
    CREATE TABLE mail_sends (
      idempotency_key text PRIMARY KEY,
      outbox_id uuid NOT NULL REFERENCES mail_outbox(id) ON DELETE CASCADE,
      state text NOT NULL CHECK (state IN ('sending', 'sent')),
      lease_until timestamptz,
      message_id text,
      sent_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now()
    );

    -- Every attempt and its outcome, shown to reception on the visit.
    CREATE TABLE mail_attempts (
      id bigserial PRIMARY KEY,
      outbox_id uuid NOT NULL REFERENCES mail_outbox(id) ON DELETE CASCADE,
      appointment_id uuid NOT NULL REFERENCES appointments(id) ON DELETE CASCADE,
      attempt smallint NOT NULL CHECK (attempt > 0),
      outcome text NOT NULL CHECK (outcome IN ('sent', 'retrying', 'failed', 'skipped')),
      detail text,
      at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX mail_attempts_appointment ON mail_attempts (appointment_id, at);
    CREATE INDEX mail_attempts_outbox ON mail_attempts (outbox_id);
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE mail_attempts;
    DROP TABLE mail_sends;
    DROP TABLE mail_outbox;
  `);
};
