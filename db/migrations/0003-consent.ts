// Informed consent: versioned templates, one consent record per visit (pending → signed →
// reviewed, or withdrawn) and the sealed PDF versions. Triggers keep signed records and
// published template versions from ever changing or disappearing.
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE consent_templates (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE RESTRICT,
      version integer NOT NULL CHECK (version > 0),
      title text NOT NULL,
      sections jsonb NOT NULL,
      status text NOT NULL DEFAULT 'published' CHECK (status IN ('published', 'withdrawn')),
      published_at timestamptz NOT NULL DEFAULT now(),
      withdrawn_at timestamptz,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (clinic_id, version),
      CHECK ((status = 'withdrawn') = (withdrawn_at IS NOT NULL))
    );
    -- One version in use per clinic at a time.
    CREATE UNIQUE INDEX consent_templates_one_published ON consent_templates (clinic_id) WHERE status = 'published';

    -- A version's text never changes (editing publishes a new version); it can only be withdrawn.
    CREATE FUNCTION consent_templates_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        RAISE EXCEPTION 'Consent template versions are never deleted.' USING ERRCODE = 'integrity_constraint_violation';
      END IF;
      IF NEW.clinic_id IS DISTINCT FROM OLD.clinic_id OR NEW.version IS DISTINCT FROM OLD.version
         OR NEW.title IS DISTINCT FROM OLD.title OR NEW.sections IS DISTINCT FROM OLD.sections
         OR NEW.published_at IS DISTINCT FROM OLD.published_at OR NEW.created_by IS DISTINCT FROM OLD.created_by
         OR NEW.created_at IS DISTINCT FROM OLD.created_at
         OR (OLD.status = 'withdrawn' AND NEW.status IS DISTINCT FROM OLD.status)
         OR (OLD.withdrawn_at IS NOT NULL AND NEW.withdrawn_at IS DISTINCT FROM OLD.withdrawn_at) THEN
        RAISE EXCEPTION 'A published consent template version cannot be changed: publish a new version instead.'
          USING ERRCODE = 'integrity_constraint_violation';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER consent_templates_immutable BEFORE UPDATE OR DELETE ON consent_templates
      FOR EACH ROW EXECUTE FUNCTION consent_templates_immutable();

    CREATE TABLE consents (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE RESTRICT,
      appointment_id uuid NOT NULL REFERENCES appointments(id) ON DELETE RESTRICT,
      patient_id uuid NOT NULL REFERENCES patients(id) ON DELETE RESTRICT,
      status text NOT NULL DEFAULT 'pending' CHECK (status IN ('pending', 'signed', 'reviewed', 'withdrawn')),
      template_id uuid REFERENCES consent_templates(id) ON DELETE RESTRICT,
      template_version integer,
      answers jsonb,
      flags jsonb NOT NULL DEFAULT '[]'::jsonb,
      acknowledged text[],
      electronic_records_version text,
      consent_text text,
      text_sha256 char(64) CHECK (text_sha256 ~ '^[0-9a-f]{64}$'),
      typed_name text,
      signature_png bytea,
      signed_at timestamptz,
      signed_ip text,
      signed_user_agent text,
      reviewed_at timestamptz,
      reviewed_by uuid REFERENCES users(id) ON DELETE RESTRICT,
      reviewed_ip text,
      reviewed_user_agent text,
      withdrawn_at timestamptz,
      withdrawn_by uuid REFERENCES users(id) ON DELETE RESTRICT,
      withdrawn_reason text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      -- A signed record carries its whole proof; only a signed record can be reviewed or withdrawn.
      CHECK (status = 'pending' OR (signed_at IS NOT NULL AND template_id IS NOT NULL AND template_version IS NOT NULL
        AND answers IS NOT NULL AND acknowledged IS NOT NULL AND electronic_records_version IS NOT NULL
        AND consent_text IS NOT NULL AND text_sha256 IS NOT NULL AND typed_name IS NOT NULL AND signature_png IS NOT NULL)),
      CHECK (status <> 'pending' OR signed_at IS NULL),
      CHECK (status <> 'reviewed' OR (reviewed_at IS NOT NULL AND reviewed_by IS NOT NULL)),
      CHECK ((status = 'withdrawn') = (withdrawn_at IS NOT NULL))
    );
    -- At most one live (not withdrawn) consent per visit; withdrawn ones stay as history.
    CREATE UNIQUE INDEX consents_one_live_per_visit ON consents (appointment_id) WHERE status <> 'withdrawn';
    CREATE INDEX consents_clinic_status ON consents (clinic_id, status);
    CREATE INDEX consents_patient ON consents (patient_id);

    -- Once signed, the proof never changes; a review is added once; a withdrawal is final. Never deleted.
    CREATE FUNCTION consents_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        RAISE EXCEPTION 'Consent records are never deleted.' USING ERRCODE = 'integrity_constraint_violation';
      END IF;
      IF NEW.clinic_id IS DISTINCT FROM OLD.clinic_id OR NEW.appointment_id IS DISTINCT FROM OLD.appointment_id
         OR NEW.patient_id IS DISTINCT FROM OLD.patient_id OR NEW.created_at IS DISTINCT FROM OLD.created_at THEN
        RAISE EXCEPTION 'A consent cannot be moved to another visit, patient or clinic.' USING ERRCODE = 'integrity_constraint_violation';
      END IF;
      IF OLD.status = 'withdrawn' THEN
        RAISE EXCEPTION 'A withdrawn consent is kept as it is.' USING ERRCODE = 'integrity_constraint_violation';
      END IF;
      IF OLD.signed_at IS NOT NULL AND (
           NEW.template_id IS DISTINCT FROM OLD.template_id OR NEW.template_version IS DISTINCT FROM OLD.template_version
           OR NEW.answers IS DISTINCT FROM OLD.answers OR NEW.flags IS DISTINCT FROM OLD.flags
           OR NEW.acknowledged IS DISTINCT FROM OLD.acknowledged
           OR NEW.electronic_records_version IS DISTINCT FROM OLD.electronic_records_version
           OR NEW.consent_text IS DISTINCT FROM OLD.consent_text OR NEW.text_sha256 IS DISTINCT FROM OLD.text_sha256
           OR NEW.typed_name IS DISTINCT FROM OLD.typed_name OR NEW.signature_png IS DISTINCT FROM OLD.signature_png
           OR NEW.signed_at IS DISTINCT FROM OLD.signed_at OR NEW.signed_ip IS DISTINCT FROM OLD.signed_ip
           OR NEW.signed_user_agent IS DISTINCT FROM OLD.signed_user_agent) THEN
        RAISE EXCEPTION 'A signed consent cannot be changed.' USING ERRCODE = 'integrity_constraint_violation';
      END IF;
      IF OLD.reviewed_at IS NOT NULL AND (
           NEW.reviewed_at IS DISTINCT FROM OLD.reviewed_at OR NEW.reviewed_by IS DISTINCT FROM OLD.reviewed_by
           OR NEW.reviewed_ip IS DISTINCT FROM OLD.reviewed_ip OR NEW.reviewed_user_agent IS DISTINCT FROM OLD.reviewed_user_agent) THEN
        RAISE EXCEPTION 'A consent review cannot be changed.' USING ERRCODE = 'integrity_constraint_violation';
      END IF;
      IF NEW.status IS DISTINCT FROM OLD.status AND NOT (
           (OLD.status = 'pending' AND NEW.status = 'signed')
           OR (OLD.status = 'signed' AND NEW.status IN ('reviewed', 'withdrawn'))
           OR (OLD.status = 'reviewed' AND NEW.status = 'withdrawn')) THEN
        RAISE EXCEPTION 'A consent cannot go from % to %.', OLD.status, NEW.status USING ERRCODE = 'integrity_constraint_violation';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER consents_guard BEFORE UPDATE OR DELETE ON consents
      FOR EACH ROW EXECUTE FUNCTION consents_guard();

    -- Every sealed PDF ever issued for a consent: v1 when signed, v2 when reviewed. Append-only.
    CREATE TABLE consent_pdfs (
      id bigserial PRIMARY KEY,
      consent_id uuid NOT NULL REFERENCES consents(id) ON DELETE RESTRICT,
      version smallint NOT NULL CHECK (version > 0),
      reason text NOT NULL CHECK (reason IN ('signed', 'reviewed')),
      pdf bytea NOT NULL,
      content_sha256 char(64) NOT NULL,
      sha256 char(64) NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (consent_id, version)
    );
    CREATE INDEX consent_pdfs_sha256 ON consent_pdfs (sha256);

    CREATE FUNCTION consent_pdfs_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'Sealed consent PDFs are never changed or deleted.' USING ERRCODE = 'integrity_constraint_violation';
    END $$;
    CREATE TRIGGER consent_pdfs_append_only BEFORE UPDATE OR DELETE ON consent_pdfs
      FOR EACH ROW EXECUTE FUNCTION consent_pdfs_append_only();
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE consent_pdfs;
    DROP FUNCTION consent_pdfs_append_only();
    DROP TABLE consents;
    DROP FUNCTION consents_guard();
    DROP TABLE consent_templates;
    DROP FUNCTION consent_templates_immutable();
  `);
};
