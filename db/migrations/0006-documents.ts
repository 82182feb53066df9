// Documents attached to a patient (uploaded by the patient or by clinic staff). The bytes live in
// object storage under a generated key; this table holds what they are, whose, and who sent them.
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE documents (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE RESTRICT,
      patient_id uuid NOT NULL REFERENCES patients(id) ON DELETE RESTRICT,
      uploaded_by_id uuid REFERENCES users(id) ON DELETE SET NULL,
      uploader_role text NOT NULL CHECK (uploader_role IN ('patient', 'reception', 'dentist', 'admin')),
      kind text NOT NULL CHECK (kind IN (
        'insurance_card_front', 'insurance_card_back', 'referral_letter', 'tooth_photo',
        'medicines_list', 'referral_reply', 'scan_export', 'other'
      )),
      title text NOT NULL CHECK (char_length(title) BETWEEN 1 AND 120),
      object_key text NOT NULL UNIQUE,
      content_type text NOT NULL CHECK (content_type IN ('image/jpeg', 'image/png', 'image/webp', 'application/pdf')),
      byte_size integer NOT NULL CHECK (byte_size > 0 AND byte_size <= 15728640),
      sha256 text NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX documents_patient ON documents (patient_id, created_at DESC);
    CREATE INDEX documents_clinic ON documents (clinic_id, created_at DESC);
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE documents;`);
};
