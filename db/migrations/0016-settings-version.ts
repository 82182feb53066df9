// Two things that keep availability and lost booking races cheap without state in one process:
// - `clinics.settings_version`, bumped by triggers in the same transaction as every write to the
//   clinic's scheduling settings (opening hours, closed days, equipment, stage durations,
//   materials, their modes, furnace programmes), so any app instance can tell whether what it
//   holds in memory is still current by reading one column;
// - `booking_alternatives`, the nearest free times offered after a lost race, computed once for a
//   short while and read by the other losers of the same race.
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

const BY_CLINIC = ["opening_hours", "closed_days", "equipment", "stage_durations", "materials", "furnace_programmes"];

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE clinics ADD COLUMN settings_version bigint NOT NULL DEFAULT 1;

    CREATE FUNCTION bump_clinic_settings_version() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP <> 'INSERT' THEN
        UPDATE clinics SET settings_version = settings_version + 1 WHERE id = OLD.clinic_id;
      END IF;
      IF TG_OP <> 'DELETE' AND (TG_OP = 'INSERT' OR NEW.clinic_id IS DISTINCT FROM OLD.clinic_id) THEN
        UPDATE clinics SET settings_version = settings_version + 1 WHERE id = NEW.clinic_id;
      END IF;
      RETURN NULL;
    END $$;

    -- Material modes name their material, not the clinic.
    CREATE FUNCTION bump_material_mode_settings_version() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP <> 'INSERT' THEN
        UPDATE clinics SET settings_version = settings_version + 1 WHERE id = (SELECT clinic_id FROM materials WHERE id = OLD.material_id);
      END IF;
      IF TG_OP <> 'DELETE' AND (TG_OP = 'INSERT' OR NEW.material_id IS DISTINCT FROM OLD.material_id) THEN
        UPDATE clinics SET settings_version = settings_version + 1 WHERE id = (SELECT clinic_id FROM materials WHERE id = NEW.material_id);
      END IF;
      RETURN NULL;
    END $$;

    ${BY_CLINIC.map((t) => `CREATE TRIGGER ${t}_settings_version AFTER INSERT OR UPDATE OR DELETE ON ${t} FOR EACH ROW EXECUTE FUNCTION bump_clinic_settings_version();`).join("\n    ")}
    CREATE TRIGGER material_modes_settings_version AFTER INSERT OR UPDATE OR DELETE ON material_modes FOR EACH ROW EXECUTE FUNCTION bump_material_mode_settings_version();

    -- A cache, not a record: unlogged (lost on a crash, which only costs one recomputation).
    CREATE UNLOGGED TABLE booking_alternatives (
      key text PRIMARY KEY,
      computed_at timestamptz NOT NULL DEFAULT now(),
      alternatives jsonb NOT NULL
    );
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE booking_alternatives;
    DROP TRIGGER material_modes_settings_version ON material_modes;
    ${[...BY_CLINIC].reverse().map((t) => `DROP TRIGGER ${t}_settings_version ON ${t};`).join("\n    ")}
    DROP FUNCTION bump_material_mode_settings_version();
    DROP FUNCTION bump_clinic_settings_version();
    ALTER TABLE clinics DROP COLUMN settings_version;
  `);
};
