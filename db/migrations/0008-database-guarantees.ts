// Guarantees the database keeps whatever the code does:
// - consents, their sealed PDFs, their templates and the audit trail cannot be emptied with TRUNCATE
//   (row triggers do not fire for it, so statement-level BEFORE TRUNCATE triggers refuse it);
// - audit events are append-only (the one change allowed is the foreign key clearing the actor
//   once that user row is gone);
// - a visit cannot move to in_progress or completed without a reviewed consent;
// - the app connects as `cuspal_app`, a login role that owns nothing: it may read and write rows
//   but cannot TRUNCATE, alter tables or disable triggers. The role running the migrations (the
//   owner) keeps owning everything, and default privileges hand the app the same rights on every
//   table and sequence that later migrations create, so they need no grants of their own.
// - the job queue (pg-boss) gets its schema here, made by the owner, because the app role may not
//   create schemas or tables.
import PgBoss from "pg-boss";
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

export const APP_ROLE = "cuspal_app";
const BOSS_SCHEMA = "pgboss";

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  const db = qi.sequelize;
  await db.query(`
    CREATE FUNCTION refuse_truncate() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'Rows of % are kept for good: TRUNCATE is refused.', TG_TABLE_NAME USING ERRCODE = 'integrity_constraint_violation';
    END $$;
    CREATE TRIGGER consents_no_truncate BEFORE TRUNCATE ON consents FOR EACH STATEMENT EXECUTE FUNCTION refuse_truncate();
    CREATE TRIGGER consent_pdfs_no_truncate BEFORE TRUNCATE ON consent_pdfs FOR EACH STATEMENT EXECUTE FUNCTION refuse_truncate();
    CREATE TRIGGER consent_templates_no_truncate BEFORE TRUNCATE ON consent_templates FOR EACH STATEMENT EXECUTE FUNCTION refuse_truncate();
    CREATE TRIGGER audit_events_no_truncate BEFORE TRUNCATE ON audit_events FOR EACH STATEMENT EXECUTE FUNCTION refuse_truncate();

    CREATE FUNCTION audit_events_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      -- ON DELETE SET NULL from users: clearing the actor is allowed only once that user is gone.
      IF TG_OP = 'UPDATE' AND OLD.actor_user_id IS NOT NULL AND NEW.actor_user_id IS NULL
         AND (to_jsonb(NEW) - 'actor_user_id') = (to_jsonb(OLD) - 'actor_user_id')
         AND NOT EXISTS (SELECT 1 FROM users WHERE id = OLD.actor_user_id) THEN
        RETURN NEW;
      END IF;
      RAISE EXCEPTION 'Audit events are never changed or deleted.' USING ERRCODE = 'integrity_constraint_violation';
    END $$;
    CREATE TRIGGER audit_events_append_only BEFORE UPDATE OR DELETE ON audit_events
      FOR EACH ROW EXECUTE FUNCTION audit_events_append_only();

    -- The same rule as the app's consent guard, for every other path (scripts, SQL, a bug).
    -- FOR SHARE holds a concurrent withdrawal back until this transaction ends.
    CREATE FUNCTION appointments_treatment_needs_consent() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'UPDATE' AND NEW.status IS NOT DISTINCT FROM OLD.status THEN
        RETURN NEW;
      END IF;
      PERFORM 1 FROM consents WHERE appointment_id = NEW.id AND status = 'reviewed' FOR SHARE;
      IF NOT FOUND THEN
        RAISE EXCEPTION 'Consent must be signed and reviewed before treatment starts.' USING ERRCODE = 'integrity_constraint_violation';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER appointments_treatment_needs_consent BEFORE INSERT OR UPDATE OF status ON appointments
      FOR EACH ROW WHEN (NEW.status IN ('in_progress', 'completed'))
      EXECUTE FUNCTION appointments_treatment_needs_consent();
  `);

  // The login role is made (with its password) by the set-up scripts; on a server where it does
  // not exist yet it is created without login, so the grants below have someone to go to.
  await db.query(`
    DO $$
    BEGIN
      IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = '${APP_ROLE}') THEN
        BEGIN
          CREATE ROLE ${APP_ROLE} NOLOGIN;
        EXCEPTION WHEN insufficient_privilege THEN
          RAISE EXCEPTION 'The role ${APP_ROLE} does not exist and this role may not create it: run CREATE ROLE ${APP_ROLE} LOGIN PASSWORD ''…'' as an administrator, then migrate again.';
        END;
      END IF;
    END $$;
  `);

  // pg-boss installs its schema on first start; here the owner does it, so the app role need not.
  const [installed] = await db.query(`SELECT to_regclass('${BOSS_SCHEMA}.version') IS NOT NULL AS present`);
  if (!(installed as { present: boolean }[])[0].present) await db.query(PgBoss.getConstructionPlans(BOSS_SCHEMA));

  await db.query(`
    GRANT USAGE ON SCHEMA public, ${BOSS_SCHEMA} TO ${APP_ROLE};
    GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public, ${BOSS_SCHEMA} TO ${APP_ROLE};
    GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public, ${BOSS_SCHEMA} TO ${APP_ROLE};
    ALTER DEFAULT PRIVILEGES IN SCHEMA public, ${BOSS_SCHEMA} GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO ${APP_ROLE};
    ALTER DEFAULT PRIVILEGES IN SCHEMA public, ${BOSS_SCHEMA} GRANT USAGE, SELECT ON SEQUENCES TO ${APP_ROLE};
    -- The migration log is the owner's; the audit trail only grows.
    REVOKE ALL ON schema_migrations FROM ${APP_ROLE};
    REVOKE UPDATE, DELETE ON audit_events FROM ${APP_ROLE};
    -- A new queue is a new partition table: made as the owner, whoever asks for the queue.
    ALTER FUNCTION ${BOSS_SCHEMA}.create_queue(text, json) SECURITY DEFINER SET search_path = pg_catalog, pg_temp;
    REVOKE EXECUTE ON FUNCTION ${BOSS_SCHEMA}.delete_queue(text) FROM PUBLIC;
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  // The job queue's schema stays, owned by the owner as when the worker made it on first start:
  // dropping it would lose queued mail. The role stays too (it is shared by every database of the
  // server); only what this migration granted in this database is taken back.
  await qi.sequelize.query(`
    GRANT EXECUTE ON FUNCTION ${BOSS_SCHEMA}.delete_queue(text) TO PUBLIC;
    ALTER FUNCTION ${BOSS_SCHEMA}.create_queue(text, json) SECURITY INVOKER RESET search_path;
    ALTER DEFAULT PRIVILEGES IN SCHEMA public, ${BOSS_SCHEMA} REVOKE USAGE, SELECT ON SEQUENCES FROM ${APP_ROLE};
    ALTER DEFAULT PRIVILEGES IN SCHEMA public, ${BOSS_SCHEMA} REVOKE SELECT, INSERT, UPDATE, DELETE ON TABLES FROM ${APP_ROLE};
    REVOKE ALL ON ALL SEQUENCES IN SCHEMA public, ${BOSS_SCHEMA} FROM ${APP_ROLE};
    REVOKE ALL ON ALL TABLES IN SCHEMA public, ${BOSS_SCHEMA} FROM ${APP_ROLE};
    REVOKE USAGE ON SCHEMA public, ${BOSS_SCHEMA} FROM ${APP_ROLE};

    DROP TRIGGER appointments_treatment_needs_consent ON appointments;
    DROP FUNCTION appointments_treatment_needs_consent();
    DROP TRIGGER audit_events_append_only ON audit_events;
    DROP FUNCTION audit_events_append_only();
    DROP TRIGGER audit_events_no_truncate ON audit_events;
    DROP TRIGGER consent_templates_no_truncate ON consent_templates;
    DROP TRIGGER consent_pdfs_no_truncate ON consent_pdfs;
    DROP TRIGGER consents_no_truncate ON consents;
    DROP FUNCTION refuse_truncate();
  `);
};
