// Materials, equipment, opening hours, proposals, visits and the equipment reservations that
// make double booking impossible (exclusion constraints over tstzrange, btree_gist).
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE EXTENSION IF NOT EXISTS btree_gist;

    -- Several rows per weekday make a lunch break (0 = Sunday … 6 = Saturday, clinic-local times).
    CREATE TABLE opening_hours (
      id bigserial PRIMARY KEY,
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE CASCADE,
      weekday smallint NOT NULL CHECK (weekday BETWEEN 0 AND 6),
      opens time NOT NULL,
      closes time NOT NULL,
      CHECK (opens < closes)
    );
    CREATE INDEX opening_hours_clinic ON opening_hours (clinic_id, weekday);

    CREATE TABLE closed_days (
      id bigserial PRIMARY KEY,
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE CASCADE,
      day date NOT NULL,
      reason text,
      UNIQUE (clinic_id, day)
    );

    CREATE TABLE equipment (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE CASCADE,
      kind text NOT NULL CHECK (kind IN ('chair', 'mill', 'furnace')),
      name text NOT NULL,
      active boolean NOT NULL DEFAULT true,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (clinic_id, name)
    );

    CREATE TABLE equipment_outages (
      id bigserial PRIMARY KEY,
      equipment_id uuid NOT NULL REFERENCES equipment(id) ON DELETE CASCADE,
      during tstzrange NOT NULL CHECK (NOT isempty(during)),
      reason text,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX equipment_outages_during ON equipment_outages USING gist (equipment_id, during);

    CREATE TABLE materials (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE CASCADE,
      key text NOT NULL,
      name text NOT NULL,
      iso6872_class smallint CHECK (iso6872_class BETWEEN 1 AND 6),
      flexural_strength_mpa integer CHECK (flexural_strength_mpa > 0),
      tooth_classes text[] NOT NULL,
      cementation text[] NOT NULL,
      fabrication text NOT NULL CHECK (fabrication IN ('dry_milling', 'wet_grinding')),
      heat_treatment text NOT NULL CHECK (heat_treatment IN ('sintering', 'crystallisation', 'none')),
      min_thickness_mm numeric(3, 1) NOT NULL,
      description text NOT NULL,
      pros text[] NOT NULL DEFAULT '{}',
      cautions text[] NOT NULL DEFAULT '{}',
      provisional_only boolean NOT NULL DEFAULT false,
      active boolean NOT NULL DEFAULT true,
      sort_order integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (clinic_id, key)
    );

    -- Per material and finishing mode: minutes of fabrication, heat treatment and finishing.
    CREATE TABLE material_modes (
      id bigserial PRIMARY KEY,
      material_id uuid NOT NULL REFERENCES materials(id) ON DELETE CASCADE,
      mode text NOT NULL CHECK (mode IN ('rapid', 'standard', 'refined')),
      fabrication_minutes integer NOT NULL CHECK (fabrication_minutes > 0),
      heat_treatment_minutes integer NOT NULL DEFAULT 0 CHECK (heat_treatment_minutes >= 0),
      finishing text NOT NULL CHECK (finishing IN ('polish', 'stain_glaze')),
      finishing_minutes integer NOT NULL CHECK (finishing_minutes > 0),
      UNIQUE (material_id, mode)
    );

    -- Clinic-wide stage minutes; a row with a tooth class overrides the general one.
    CREATE TABLE stage_durations (
      id bigserial PRIMARY KEY,
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE CASCADE,
      stage text NOT NULL,
      tooth_class text CHECK (tooth_class IN ('anterior', 'premolar', 'molar')),
      minutes integer NOT NULL CHECK (minutes > 0)
    );
    CREATE UNIQUE INDEX stage_durations_key ON stage_durations (clinic_id, stage, coalesce(tooth_class, ''));

    CREATE TABLE proposals (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE CASCADE,
      patient_id uuid NOT NULL REFERENCES patients(id) ON DELETE RESTRICT,
      dentist_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      tooth smallint NOT NULL,
      fee_cents integer NOT NULL CHECK (fee_cents >= 0),
      note text,
      status text NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'closed')),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX proposals_patient ON proposals (patient_id);

    CREATE TABLE proposal_materials (
      id bigserial PRIMARY KEY,
      proposal_id uuid NOT NULL REFERENCES proposals(id) ON DELETE CASCADE,
      material_id uuid NOT NULL REFERENCES materials(id) ON DELETE RESTRICT,
      modes text[] NOT NULL CHECK (cardinality(modes) > 0 AND modes <@ ARRAY['rapid', 'standard', 'refined']),
      UNIQUE (proposal_id, material_id)
    );

    CREATE TABLE appointments (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE CASCADE,
      proposal_id uuid NOT NULL REFERENCES proposals(id) ON DELETE RESTRICT,
      patient_id uuid NOT NULL REFERENCES patients(id) ON DELETE RESTRICT,
      dentist_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      material_id uuid NOT NULL REFERENCES materials(id) ON DELETE RESTRICT,
      mode text NOT NULL CHECK (mode IN ('rapid', 'standard', 'refined')),
      tooth smallint NOT NULL,
      status text NOT NULL DEFAULT 'requested' CHECK (status IN
        ('requested', 'confirmed', 'checked_in', 'in_progress', 'completed', 'declined', 'cancelled', 'no_show')),
      starts_at timestamptz NOT NULL,
      ends_at timestamptz NOT NULL,
      chair_id uuid NOT NULL REFERENCES equipment(id),
      mill_id uuid NOT NULL REFERENCES equipment(id),
      furnace_id uuid REFERENCES equipment(id),
      fee_cents integer NOT NULL,
      status_reason text,
      reminders_enabled boolean NOT NULL DEFAULT true,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (starts_at < ends_at)
    );
    -- A proposal has at most one active visit.
    CREATE UNIQUE INDEX appointments_one_active_per_proposal ON appointments (proposal_id)
      WHERE status IN ('requested', 'confirmed', 'checked_in', 'in_progress');
    CREATE INDEX appointments_clinic_start ON appointments (clinic_id, starts_at);
    CREATE INDEX appointments_patient ON appointments (patient_id);

    CREATE TABLE appointment_stages (
      id bigserial PRIMARY KEY,
      appointment_id uuid NOT NULL REFERENCES appointments(id) ON DELETE CASCADE,
      seq smallint NOT NULL,
      key text NOT NULL,
      planned_start timestamptz NOT NULL,
      planned_end timestamptz NOT NULL,
      actual_start timestamptz,
      actual_end timestamptz,
      equipment text[] NOT NULL,
      UNIQUE (appointment_id, key)
    );

    -- One row per resource (a piece of equipment or the dentist) per stage window.
    -- Inactive rows belong to cancelled, declined or moved visits and block nothing.
    CREATE TABLE reservations (
      id bigserial PRIMARY KEY,
      appointment_id uuid NOT NULL REFERENCES appointments(id) ON DELETE CASCADE,
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE CASCADE,
      resource_kind text NOT NULL CHECK (resource_kind IN ('chair', 'mill', 'furnace', 'dentist')),
      resource_id uuid NOT NULL,
      stage text NOT NULL,
      during tstzrange NOT NULL CHECK (NOT isempty(during)),
      active boolean NOT NULL DEFAULT true,
      EXCLUDE USING gist (resource_id WITH =, during WITH &&) WHERE (active)
    );
    CREATE INDEX reservations_clinic_during ON reservations USING gist (clinic_id, during) WHERE active;
    CREATE INDEX reservations_appointment ON reservations (appointment_id);
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE reservations;
    DROP TABLE appointment_stages;
    DROP TABLE appointments;
    DROP TABLE proposal_materials;
    DROP TABLE proposals;
    DROP TABLE stage_durations;
    DROP TABLE material_modes;
    DROP TABLE materials;
    DROP TABLE equipment_outages;
    DROP TABLE equipment;
    DROP TABLE closed_days;
    DROP TABLE opening_hours;
  `);
};
