// The day board's records: crown blocks (lots) used on each visit for traceability and recalls,
// and a guard that a stage's actual end never comes before its actual start.
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    -- One row per block used on a visit (a second row when a block had to be replaced).
    CREATE TABLE block_lots (
      id bigserial PRIMARY KEY,
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE RESTRICT,
      appointment_id uuid NOT NULL REFERENCES appointments(id) ON DELETE RESTRICT,
      patient_id uuid NOT NULL REFERENCES patients(id) ON DELETE RESTRICT,
      gtin text CHECK (gtin ~ '^[0-9]{14}$'),
      lot text NOT NULL CHECK (char_length(lot) BETWEEN 1 AND 20),
      expiry date,
      serial text CHECK (char_length(serial) BETWEEN 1 AND 20),
      element_string text,
      source text NOT NULL CHECK (source IN ('code', 'typed')),
      recorded_by uuid REFERENCES users(id) ON DELETE SET NULL,
      recorded_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX block_lots_appointment ON block_lots (appointment_id, recorded_at);
    CREATE INDEX block_lots_clinic_lot ON block_lots (clinic_id, upper(lot));
    CREATE INDEX block_lots_patient ON block_lots (patient_id, recorded_at);

    ALTER TABLE appointment_stages ADD CONSTRAINT appointment_stages_actual_order
      CHECK (actual_end IS NULL OR (actual_start IS NOT NULL AND actual_end >= actual_start));
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE appointment_stages DROP CONSTRAINT appointment_stages_actual_order;
    DROP TABLE block_lots;
  `);
};
