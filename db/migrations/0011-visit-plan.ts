// The visit plan as data: each material's stage order and glaze-firing minutes, the clinic's
// furnace programmes (which furnaces can run them, assigned per material, mode and firing), the
// shade and block recorded for milling, and how a consent withdrawal reached the clinic.
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

const PREFIX = `'check_in', 'anaesthesia', 'preparation', 'scan', 'design', 'fabrication'`;

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE materials ADD COLUMN stage_order text[] NOT NULL
      DEFAULT ARRAY[${PREFIX}, 'try_in', 'finishing', 'glaze_firing', 'cementation', 'aftercare'];
    -- Existing catalogues get the common-practice order of their kind of material.
    UPDATE materials SET stage_order = ARRAY[${PREFIX}, 'heat_treatment', 'finishing', 'glaze_firing', 'try_in', 'cementation', 'aftercare']
      WHERE heat_treatment = 'sintering';
    UPDATE materials SET stage_order = ARRAY[${PREFIX}, 'try_in', 'finishing', 'heat_treatment', 'cementation', 'aftercare']
      WHERE heat_treatment = 'crystallisation';
    UPDATE materials SET stage_order = ARRAY[${PREFIX}, 'try_in', 'finishing', 'cementation', 'aftercare']
      WHERE heat_treatment = 'none' AND key IN ('resin-ceramic-hybrid', 'pmma');

    CREATE TABLE furnace_programmes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE CASCADE,
      name text NOT NULL CHECK (char_length(name) BETWEEN 1 AND 60),
      minutes integer NOT NULL CHECK (minutes BETWEEN 1 AND 600),
      -- The furnaces (equipment rows of kind furnace) able to run this programme.
      furnace_ids uuid[] NOT NULL DEFAULT '{}',
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (clinic_id, name)
    );

    ALTER TABLE material_modes
      ADD COLUMN glaze_firing_minutes integer NOT NULL DEFAULT 0 CHECK (glaze_firing_minutes >= 0),
      ADD COLUMN heat_programme_id uuid REFERENCES furnace_programmes(id) ON DELETE SET NULL,
      ADD COLUMN glaze_programme_id uuid REFERENCES furnace_programmes(id) ON DELETE SET NULL;
    -- [C] a zirconia stain-and-glaze finish is fired in roughly 10–20 minutes.
    UPDATE material_modes mm SET glaze_firing_minutes = 15
      FROM materials m WHERE m.id = mm.material_id AND m.heat_treatment = 'sintering' AND mm.finishing = 'stain_glaze';

    -- Recorded by the dentist at the visit: the VITA classical shade and the block size to load.
    ALTER TABLE appointments
      ADD COLUMN shade text CHECK (shade IN ('A1', 'A2', 'A3', 'A3.5', 'A4', 'B1', 'B2', 'B3', 'B4', 'C1', 'C2', 'C3', 'C4', 'D2', 'D3', 'D4')),
      ADD COLUMN block_size text CHECK (char_length(block_size) BETWEEN 1 AND 20),
      ADD COLUMN block_loaded_at timestamptz,
      ADD COLUMN block_loaded_by uuid REFERENCES users(id) ON DELETE SET NULL;

    -- A withdrawal the patient makes by phone, in person or in writing, recorded by staff.
    ALTER TABLE consents
      ADD COLUMN withdrawn_via text CHECK (withdrawn_via IN ('online', 'phone', 'in_person', 'in_writing')),
      ADD COLUMN withdrawn_by_name text CHECK (char_length(withdrawn_by_name) BETWEEN 1 AND 120);
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE consents DROP COLUMN withdrawn_by_name, DROP COLUMN withdrawn_via;
    ALTER TABLE appointments DROP COLUMN block_loaded_by, DROP COLUMN block_loaded_at, DROP COLUMN block_size, DROP COLUMN shade;
    ALTER TABLE material_modes DROP COLUMN glaze_programme_id, DROP COLUMN heat_programme_id, DROP COLUMN glaze_firing_minutes;
    DROP TABLE furnace_programmes;
    ALTER TABLE materials DROP COLUMN stage_order;
  `);
};
