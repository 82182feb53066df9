// Languages: the French text of each consent template version,
// the language a consent was signed in, per-language material texts, and the clinic's jurisdiction.
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    -- (The patient's own language column comes with the patient records migration, 0009.)
    -- A version published before French existed has no French text: its patients read it in English.
    ALTER TABLE consent_templates ADD COLUMN title_fr text, ADD COLUMN sections_fr jsonb,
      ADD CONSTRAINT consent_templates_fr_pair CHECK ((title_fr IS NULL) = (sections_fr IS NULL));
    CREATE FUNCTION consent_templates_fr_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.title_fr IS DISTINCT FROM OLD.title_fr OR NEW.sections_fr IS DISTINCT FROM OLD.sections_fr THEN
        RAISE EXCEPTION 'A published consent template version cannot be changed: publish a new version instead.'
          USING ERRCODE = 'integrity_constraint_violation';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER consent_templates_fr_immutable BEFORE UPDATE ON consent_templates
      FOR EACH ROW EXECUTE FUNCTION consent_templates_fr_immutable();

    ALTER TABLE consents ADD COLUMN language text NOT NULL DEFAULT 'en' CHECK (language IN ('en', 'fr'));

    -- { "fr": { "description": "…", "pros": […], "cautions": […] } }; English stays in the columns.
    ALTER TABLE materials ADD COLUMN translations jsonb NOT NULL DEFAULT '{}'::jsonb;

    -- ISO 3166-2 subdivision code; the electronic-records agreement and privacy wording follow it.
    ALTER TABLE clinics ADD COLUMN jurisdiction text NOT NULL DEFAULT 'CA-ON';
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE clinics DROP COLUMN jurisdiction;
    ALTER TABLE materials DROP COLUMN translations;
    ALTER TABLE consents DROP COLUMN language;
    DROP TRIGGER consent_templates_fr_immutable ON consent_templates;
    DROP FUNCTION consent_templates_fr_immutable();
    ALTER TABLE consent_templates DROP CONSTRAINT consent_templates_fr_pair, DROP COLUMN sections_fr, DROP COLUMN title_fr;
  `);
};
