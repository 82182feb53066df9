// Money: per-material list prices and proposal fees, the clinic's deposit policy, deposits paid
// through the payment service, the webhook events already handled (each once), desk payments,
// and the patient's dental-plan estimate. Amounts are integer cents beside an ISO 4217 code.
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

const OLD_KINDS = `'visit_requested', 'visit_confirmed', 'visit_moved', 'visit_declined', 'visit_cancelled', 'reminder', 'aftercare', 'consent_copy'`;

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE materials ADD COLUMN list_fee_cents integer CHECK (list_fee_cents >= 0);
    ALTER TABLE proposal_materials ADD COLUMN fee_cents integer CHECK (fee_cents >= 0);

    ALTER TABLE clinics
      ADD COLUMN deposit_kind text NOT NULL DEFAULT 'none' CHECK (deposit_kind IN ('none', 'fixed', 'percent')),
      ADD COLUMN deposit_value integer NOT NULL DEFAULT 0 CHECK (deposit_value >= 0),
      ADD COLUMN deposit_refund_hours integer NOT NULL DEFAULT 48 CHECK (deposit_refund_hours BETWEEN 0 AND 720),
      ADD CONSTRAINT clinics_deposit_percent CHECK (deposit_kind <> 'percent' OR deposit_value <= 100);

    -- One deposit per visit. due → paid → refunded; due → waived | released (hold let go unpaid).
    CREATE TABLE deposits (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE RESTRICT,
      appointment_id uuid NOT NULL UNIQUE REFERENCES appointments(id) ON DELETE RESTRICT,
      amount_cents integer NOT NULL CHECK (amount_cents > 0),
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      status text NOT NULL DEFAULT 'due' CHECK (status IN ('due', 'paid', 'refunded', 'waived', 'released')),
      checkout_session_id text UNIQUE,
      payment_intent_id text UNIQUE,
      refund_id text,
      paid_at timestamptz,
      refunded_at timestamptz,
      closed_reason text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX deposits_clinic ON deposits (clinic_id, created_at DESC);
    CREATE INDEX deposits_due ON deposits (created_at) WHERE status = 'due';

    -- Each payment-service event is handled once: the primary key is the replay guard.
    CREATE TABLE payment_events (
      event_id text PRIMARY KEY,
      type text NOT NULL,
      deposit_id uuid REFERENCES deposits(id) ON DELETE SET NULL,
      received_at timestamptz NOT NULL DEFAULT now()
    );

    -- The rest of the fee, taken at the desk.
    CREATE TABLE desk_payments (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE RESTRICT,
      appointment_id uuid NOT NULL REFERENCES appointments(id) ON DELETE RESTRICT,
      amount_cents integer NOT NULL CHECK (amount_cents > 0),
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      method text NOT NULL CHECK (method IN ('card', 'debit', 'cash', 'cheque', 'transfer', 'plan')),
      reference text CHECK (char_length(reference) <= 80),
      recorded_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX desk_payments_appointment ON desk_payments (appointment_id);

    -- A dental-plan estimate for one crown proposal (so each material's share can be shown before
    -- booking), entered by staff or the patient. Never the plan's decision.
    CREATE TABLE plan_estimates (
      proposal_id uuid PRIMARY KEY REFERENCES proposals(id) ON DELETE CASCADE,
      coverage_percent integer NOT NULL CHECK (coverage_percent BETWEEN 0 AND 100),
      deductible_remaining_cents integer NOT NULL CHECK (deductible_remaining_cents >= 0),
      annual_max_remaining_cents integer NOT NULL CHECK (annual_max_remaining_cents >= 0),
      preauth_reference text CHECK (char_length(preauth_reference) <= 60),
      entered_by uuid REFERENCES users(id) ON DELETE SET NULL,
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    ALTER TABLE mail_outbox DROP CONSTRAINT mail_outbox_kind_check;
    ALTER TABLE mail_outbox ADD CONSTRAINT mail_outbox_kind_check CHECK (kind IN (${OLD_KINDS}, 'deposit_paid', 'deposit_refunded'));
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DELETE FROM mail_outbox WHERE kind IN ('deposit_paid', 'deposit_refunded');
    ALTER TABLE mail_outbox DROP CONSTRAINT mail_outbox_kind_check;
    ALTER TABLE mail_outbox ADD CONSTRAINT mail_outbox_kind_check CHECK (kind IN (${OLD_KINDS}));
    DROP TABLE plan_estimates;
    DROP TABLE desk_payments;
    DROP TABLE payment_events;
    DROP TABLE deposits;
    ALTER TABLE clinics DROP CONSTRAINT clinics_deposit_percent, DROP COLUMN deposit_refund_hours, DROP COLUMN deposit_value, DROP COLUMN deposit_kind;
    ALTER TABLE proposal_materials DROP COLUMN fee_cents;
    ALTER TABLE materials DROP COLUMN list_fee_cents;
  `);
};
