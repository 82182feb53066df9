// Account state that sign-in and every request depend on: the per-request session check, the
// session version, and the second factor (codes and recovery codes).
import "server-only";
import { QueryTypes, type Transaction } from "sequelize";
import { selectRows } from "@/db/select-rows";
import { sequelize } from "@/db/sequelize";
import type { Role } from "@/db/models/user";
import { recordAudit } from "@/lib/server/audit";
import { checkTotp, hashRecoveryCode, looksLikeRecoveryCode, newRecoveryCodes, newTotpSecret, openSecret, sealSecret, totpUri } from "./totp";

export const STAFF_LIFETIME_SECONDS = 12 * 60 * 60;
export const PATIENT_LIFETIME_SECONDS = 30 * 24 * 60 * 60;
export const lifetimeFor = (role: Role) => (role === "patient" ? PATIENT_LIFETIME_SECONDS : STAFF_LIFETIME_SECONDS);

export type AccountState = {
  active: boolean;
  role: Role;
  clinicId: string | null;
  sessionVersion: number;
  enrolled: boolean;
  requireTwoFactor: boolean;
};

/** One primary-key lookup (with the clinic's row by its key): what a session is checked against. */
export async function accountState(userId: string): Promise<AccountState | null> {
  const rows = await selectRows<AccountState>(
    `SELECT u.active, u.role, u.clinic_id AS "clinicId", u.session_version AS "sessionVersion",
            u.totp_enabled_at IS NOT NULL AS enrolled, coalesce(c.require_two_factor, false) AS "requireTwoFactor"
       FROM users u LEFT JOIN clinics c ON c.id = u.clinic_id
      WHERE u.id = $1`,
    [userId],
  );
  return rows[0] ?? null;
}

/** Ends every open session of the account: their tokens carry the old version. */
export async function bumpSessionVersion(userId: string, transaction?: Transaction) {
  await sequelize.query(`UPDATE users SET session_version = session_version + 1 WHERE id = :userId`, { replacements: { userId }, transaction });
}

/** "Sign out everywhere" for the signed-in person, audited with the change. */
export async function signOutEverywhere(actor: { id: string; clinicId: string | null }, meta: { ip?: string; userAgent?: string }) {
  await sequelize.transaction(async (transaction) => {
    await bumpSessionVersion(actor.id, transaction);
    await recordAudit(
      { clinicId: actor.clinicId, actorUserId: actor.id, action: "auth.signed_out_everywhere", subjectType: "user", subjectId: actor.id, ip: meta.ip, userAgent: meta.userAgent },
      transaction,
    );
  });
}

/**
 * Checks a second-factor code for an enrolled account: a current authenticator code (each time
 * step once) or an unused recovery code (each once). Both are settled by one conditional UPDATE,
 * so two requests racing with the same code cannot both pass.
 */
export async function checkSecondFactor(userId: string, code: string, now = new Date()): Promise<"code" | "recovery_code" | null> {
  if (looksLikeRecoveryCode(code)) {
    const used = await sequelize.query(
      `UPDATE recovery_codes SET used_at = now() WHERE user_id = :userId AND code_hash = :hash AND used_at IS NULL RETURNING id`,
      { replacements: { userId, hash: hashRecoveryCode(code) }, type: QueryTypes.SELECT },
    );
    return used.length === 1 ? "recovery_code" : null;
  }
  const [row] = await sequelize.query<{ secret: string | null; lastStep: string | null }>(
    `SELECT totp_secret AS secret, totp_last_step AS "lastStep" FROM users WHERE id = :userId AND totp_enabled_at IS NOT NULL`,
    { replacements: { userId }, type: QueryTypes.SELECT },
  );
  if (!row?.secret) return null;
  const step = await checkTotp(openSecret(row.secret), code, { now, afterStep: row.lastStep == null ? null : Number(row.lastStep) });
  if (step === null) return null;
  const claimed = await sequelize.query(
    `UPDATE users SET totp_last_step = :step WHERE id = :userId AND (totp_last_step IS NULL OR totp_last_step < :step) RETURNING id`,
    { replacements: { userId, step }, type: QueryTypes.SELECT },
  );
  return claimed.length === 1 ? "code" : null;
}

/** The secret being enrolled (kept while enrolment is unfinished, so a reload shows the same one). */
export async function pendingEnrolment(userId: string, email: string): Promise<{ secret: string; uri: string } | "enrolled"> {
  const [row] = await sequelize.query<{ secret: string | null; enrolled: boolean }>(
    `SELECT totp_secret AS secret, totp_enabled_at IS NOT NULL AS enrolled FROM users WHERE id = :userId`,
    { replacements: { userId }, type: QueryTypes.SELECT },
  );
  if (row?.enrolled) return "enrolled";
  let secret = row?.secret ? openSecret(row.secret) : null;
  if (!secret) {
    secret = newTotpSecret();
    await sequelize.query(`UPDATE users SET totp_secret = :sealed WHERE id = :userId AND totp_enabled_at IS NULL`, {
      replacements: { userId, sealed: sealSecret(secret) },
    });
  }
  return { secret, uri: totpUri(secret, email) };
}

/** Finishes enrolment with the first code; returns the recovery codes (shown once, stored hashed). */
export async function confirmEnrolment(
  actor: { id: string; clinicId: string | null },
  code: string,
  meta: { ip?: string; userAgent?: string },
  now = new Date(),
): Promise<string[] | null> {
  return sequelize.transaction(async (transaction) => {
    const [row] = await sequelize.query<{ secret: string | null }>(
      `SELECT totp_secret AS secret FROM users WHERE id = :userId AND totp_enabled_at IS NULL FOR UPDATE`,
      { replacements: { userId: actor.id }, type: QueryTypes.SELECT, transaction },
    );
    if (!row?.secret) return null;
    const step = await checkTotp(openSecret(row.secret), code, { now });
    if (step === null) return null;
    const codes = newRecoveryCodes();
    await sequelize.query(`UPDATE users SET totp_enabled_at = now(), totp_last_step = :step WHERE id = :userId`, {
      replacements: { userId: actor.id, step },
      transaction,
    });
    await sequelize.query(`DELETE FROM recovery_codes WHERE user_id = :userId`, { replacements: { userId: actor.id }, transaction });
    await sequelize.query(
      `INSERT INTO recovery_codes (user_id, code_hash) SELECT :userId, unnest(ARRAY[:hashes]::text[])`,
      { replacements: { userId: actor.id, hashes: codes.map(hashRecoveryCode) }, transaction },
    );
    await recordAudit(
      { clinicId: actor.clinicId, actorUserId: actor.id, action: "auth.two_factor_enabled", subjectType: "user", subjectId: actor.id, ip: meta.ip, userAgent: meta.userAgent },
      transaction,
    );
    return codes;
  });
}
