// Sign-in security: a session version on each account (bumped when access changes, so open
// sessions end), two-factor sign-in for staff, and throttling counters shared by every app instance.
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE users
      ADD COLUMN session_version integer NOT NULL DEFAULT 1,
      ADD COLUMN totp_secret text,
      ADD COLUMN totp_enabled_at timestamptz,
      ADD COLUMN totp_last_step bigint;

    -- Clinics that exist already keep signing in as before; a clinic created from now on requires it.
    ALTER TABLE clinics ADD COLUMN require_two_factor boolean NOT NULL DEFAULT false;
    ALTER TABLE clinics ALTER COLUMN require_two_factor SET DEFAULT true;

    CREATE TABLE recovery_codes (
      id bigserial PRIMARY KEY,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      code_hash text NOT NULL CHECK (code_hash ~ '^[0-9a-f]{64}$'),
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (user_id, code_hash)
    );

    -- One row per throttling key and fixed window; attempts are counted with one upsert.
    CREATE TABLE sign_in_counters (
      key text NOT NULL,
      window_start timestamptz NOT NULL,
      count integer NOT NULL,
      next_allowed_at timestamptz NOT NULL,
      PRIMARY KEY (key, window_start)
    );
    CREATE INDEX sign_in_counters_window ON sign_in_counters (window_start);
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE sign_in_counters;
    DROP TABLE recovery_codes;
    ALTER TABLE clinics DROP COLUMN require_two_factor;
    ALTER TABLE users
      DROP COLUMN totp_last_step,
      DROP COLUMN totp_enabled_at,
      DROP COLUMN totp_secret,
      DROP COLUMN session_version;
  `);
};
