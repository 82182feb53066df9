// Patient records a clinic keeps itself: contact details and preferences, archiving, sign-in times,
// invitations (with a throttle kept in PostgreSQL), e-mail changes that wait for confirmation, and
// accent-insensitive trigram search over name and e-mail (pg_trgm + unaccent, both in contrib).
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE EXTENSION IF NOT EXISTS pg_trgm;
    CREATE EXTENSION IF NOT EXISTS unaccent;

    -- unaccent() is only STABLE (its dictionary could change), so an index cannot use it directly.
    -- Naming the dictionary makes the result depend on the argument alone, which is what IMMUTABLE promises.
    CREATE FUNCTION cuspal_unaccent(text) RETURNS text
      LANGUAGE sql IMMUTABLE PARALLEL SAFE STRICT
      AS $$ SELECT public.unaccent('public.unaccent'::regdictionary, $1) $$;

    -- What a staff search matches against: the folded name and the e-mail, in one indexed text.
    CREATE FUNCTION cuspal_person_key(name text, email text) RETURNS text
      LANGUAGE sql IMMUTABLE PARALLEL SAFE
      AS $$ SELECT lower(cuspal_unaccent(coalesce(name, ''))) || ' ' || lower(coalesce(email, '')) $$;

    CREATE INDEX users_person_key_trgm ON users USING gin (cuspal_person_key(name, email) gin_trgm_ops);

    ALTER TABLE patients
      ADD COLUMN language text NOT NULL DEFAULT 'en' CHECK (language IN ('en', 'fr')),
      ADD COLUMN address text CHECK (address IS NULL OR char_length(address) <= 300),
      ADD COLUMN reminders boolean NOT NULL DEFAULT true,
      ADD COLUMN archived_at timestamptz,
      ADD COLUMN first_signed_in_at timestamptz,
      ADD COLUMN last_signed_in_at timestamptz;
    -- Phones are stored in E.164 from now on. Older rows lose only their spacing; a row that still does
    -- not fit is left as it is (NOT VALID) for staff to correct, rather than dropped.
    UPDATE patients SET phone = regexp_replace(phone, '[^0-9+]', '', 'g') WHERE phone IS NOT NULL;
    ALTER TABLE patients ADD CONSTRAINT patients_phone_e164 CHECK (phone IS NULL OR phone ~ '^\\+[1-9][0-9]{1,14}$') NOT VALID;
    CREATE INDEX patients_phone_trgm ON patients USING gin (phone gin_trgm_ops);
    CREATE INDEX patients_clinic_dob ON patients (clinic_id, date_of_birth);

    -- One row per invitation e-mail; the latest says when the patient was last invited, and the
    -- rows of the last hour are the throttle (shared by every app instance).
    CREATE TABLE patient_invitations (
      id bigserial PRIMARY KEY,
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE CASCADE,
      patient_id uuid NOT NULL REFERENCES patients(id) ON DELETE CASCADE,
      sent_by uuid REFERENCES users(id) ON DELETE SET NULL,
      sent_at timestamptz NOT NULL DEFAULT now(),
      expires_at timestamptz NOT NULL
    );
    CREATE INDEX patient_invitations_patient ON patient_invitations (patient_id, sent_at DESC);

    -- A new e-mail address waits here until the link sent to it is followed. Only the token's hash is kept.
    CREATE TABLE email_changes (
      token_hash text PRIMARY KEY CHECK (token_hash ~ '^[0-9a-f]{64}$'),
      patient_id uuid NOT NULL REFERENCES patients(id) ON DELETE CASCADE,
      new_email text NOT NULL CHECK (new_email = lower(new_email)),
      expires_at timestamptz NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX email_changes_patient ON email_changes (patient_id);
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE email_changes;
    DROP TABLE patient_invitations;
    DROP INDEX patients_clinic_dob;
    DROP INDEX patients_phone_trgm;
    ALTER TABLE patients
      DROP CONSTRAINT patients_phone_e164,
      DROP COLUMN last_signed_in_at,
      DROP COLUMN first_signed_in_at,
      DROP COLUMN archived_at,
      DROP COLUMN reminders,
      DROP COLUMN address,
      DROP COLUMN language;
    DROP INDEX users_person_key_trgm;
    DROP FUNCTION cuspal_person_key(text, text);
    DROP FUNCTION cuspal_unaccent(text);
    DROP EXTENSION unaccent;
    DROP EXTENSION pg_trgm;
  `);
};
