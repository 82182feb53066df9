// Clinics, people, sign-in (next-auth tables), audit trail and the sign-in rate limit.
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE clinics (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      slug text NOT NULL UNIQUE,
      time_zone text NOT NULL,
      address text NOT NULL,
      phone text,
      currency char(3) NOT NULL DEFAULT 'CAD',
      settings jsonb NOT NULL DEFAULT '{}'::jsonb,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      email text NOT NULL,
      name text,
      email_verified timestamptz,
      image text,
      password_hash text,
      role text NOT NULL DEFAULT 'patient' CHECK (role IN ('patient', 'reception', 'dentist', 'admin')),
      clinic_id uuid REFERENCES clinics(id) ON DELETE RESTRICT,
      active boolean NOT NULL DEFAULT true,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT users_email_lowercase CHECK (email = lower(email))
    );
    CREATE UNIQUE INDEX users_email_key ON users (email);

    -- Tables of next-auth's Sequelize adapter (the e-mail sign-in link uses verification_tokens).
    CREATE TABLE accounts (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      type text NOT NULL,
      provider text NOT NULL,
      provider_account_id text NOT NULL,
      refresh_token text, access_token text, expires_at integer, token_type text,
      scope text, id_token text, session_state text,
      user_id uuid REFERENCES users(id) ON DELETE CASCADE
    );
    CREATE TABLE sessions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      expires timestamptz NOT NULL,
      session_token text NOT NULL UNIQUE,
      user_id uuid REFERENCES users(id) ON DELETE CASCADE
    );
    CREATE TABLE verification_tokens (
      token text PRIMARY KEY,
      identifier text NOT NULL,
      expires timestamptz NOT NULL
    );

    CREATE TABLE patients (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL UNIQUE REFERENCES users(id) ON DELETE RESTRICT,
      clinic_id uuid NOT NULL REFERENCES clinics(id) ON DELETE RESTRICT,
      date_of_birth date,
      phone text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE audit_events (
      id bigserial PRIMARY KEY,
      clinic_id uuid REFERENCES clinics(id) ON DELETE RESTRICT,
      actor_user_id uuid REFERENCES users(id) ON DELETE SET NULL,
      action text NOT NULL,
      subject_type text NOT NULL,
      subject_id text NOT NULL,
      at timestamptz NOT NULL DEFAULT now(),
      ip text,
      user_agent text,
      data jsonb NOT NULL DEFAULT '{}'::jsonb
    );
    CREATE INDEX audit_events_subject ON audit_events (subject_type, subject_id, at);

    -- Failed sign-ins, counted per e-mail and per IP to slow down guessing (shared by all app instances).
    CREATE TABLE sign_in_attempts (
      id bigserial PRIMARY KEY,
      email text NOT NULL,
      ip text NOT NULL,
      at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX sign_in_attempts_email_at ON sign_in_attempts (email, at);
    CREATE INDEX sign_in_attempts_ip_at ON sign_in_attempts (ip, at);
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE sign_in_attempts;
    DROP TABLE audit_events;
    DROP TABLE patients;
    DROP TABLE verification_tokens;
    DROP TABLE sessions;
    DROP TABLE accounts;
    DROP TABLE users;
    DROP TABLE clinics;
  `);
};
