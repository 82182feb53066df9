// Inviting a patient: a one-time sign-in link of next-auth's e-mail provider, made by us with a
// longer life (72 h), e-mailed by the clinic. The throttle counts invitation rows in PostgreSQL.
import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { createElement } from "react";
import { QueryTypes } from "sequelize";
import { Clinic, Patient, User, sequelize } from "@/db/models";
import PatientInvitationEmail from "@/emails/patient-invitation";
import type { SessionUser } from "@/lib/auth/session";
import { isUuid } from "@/lib/domain/documents";
import { displayPhone } from "@/lib/domain/patient-record";
import { env } from "@/lib/env";
import { emailTranslator } from "@/lib/i18n/email";
import { renderEmail } from "@/lib/mail/render";
import { mailFrom, mailTransport } from "@/lib/mail/transport";
import { recordAudit } from "@/lib/server/audit";
import { AppError, conflict, forbidden, notFound } from "@/lib/server/errors";

export const INVITATION_HOURS = 72;
export const INVITATIONS_PER_HOUR = 3;

/**
 * The token as next-auth stores it: sha256(token + secret), hex (next-auth 4,
 * core/lib/utils.js `hashToken`; the e-mail callback hashes the link's token the same way).
 */
export function hashSignInToken(token: string, secret = env().NEXTAUTH_SECRET): string {
  return createHash("sha256").update(`${token}${secret}`).digest("hex");
}

/** next-auth's own e-mail callback, which checks the token, signs in and goes on to the patient's pages. */
export function signInLink(token: string, email: string, base = env().APP_URL): string {
  const url = new URL("/api/auth/callback/email", base);
  url.searchParams.set("callbackUrl", new URL("/patient", base).toString());
  url.searchParams.set("token", token);
  url.searchParams.set("email", email);
  return url.toString();
}

export async function invitePatient({ user, patientId, info = {}, now = new Date() }: {
  user: SessionUser; patientId: string; info?: { ip?: string | null; userAgent?: string | null }; now?: Date;
}): Promise<{ expiresAt: Date }> {
  if (user.role === "patient" || !user.clinicId) throw forbidden();
  if (!isUuid(patientId)) throw notFound("That patient");
  const clinicId = user.clinicId;
  return sequelize.transaction(async (transaction) => {
    // The row lock makes concurrent invitations for one patient take turns, so the count below is exact.
    const patient = await Patient.findOne({ where: { id: patientId, clinicId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!patient) throw notFound("That patient");
    if (patient.archivedAt) throw conflict("This patient is archived. Unarchive them before sending an invitation.");
    const [account, clinic] = await Promise.all([
      User.findByPk(patient.userId, { transaction }),
      Clinic.findByPk(clinicId, { transaction }),
    ]);
    if (!account || !clinic) throw notFound("That patient");
    const [recent] = await sequelize.query<{ n: string }>(
      `SELECT count(*) AS n FROM patient_invitations WHERE patient_id = $1 AND sent_at > $2::timestamptz - interval '1 hour'`,
      { bind: [patient.id, now], transaction, type: QueryTypes.SELECT },
    );
    if (Number(recent?.n ?? 0) >= INVITATIONS_PER_HOUR) {
      throw new AppError(429, `This patient has already been sent ${INVITATIONS_PER_HOUR} invitations in the last hour. Please wait before sending another.`, { code: "too_many_invitations" });
    }
    const token = randomBytes(32).toString("hex");
    const expiresAt = new Date(now.getTime() + INVITATION_HOURS * 3600_000);
    // A new invitation replaces any earlier link (next-auth also clears them all once one is used).
    await sequelize.query(`DELETE FROM verification_tokens WHERE identifier = $1`, { bind: [account.email], transaction });
    await sequelize.query(`INSERT INTO verification_tokens (token, identifier, expires) VALUES ($1, $2, $3)`, {
      bind: [hashSignInToken(token), account.email, expiresAt], transaction,
    });
    await sequelize.query(`INSERT INTO patient_invitations (clinic_id, patient_id, sent_by, sent_at, expires_at) VALUES ($1, $2, $3, $4, $5)`, {
      bind: [clinicId, patient.id, user.id, now, expiresAt], transaction,
    });
    await recordAudit(
      { clinicId, actorUserId: user.id, action: "patient.invited", subjectType: "patient", subjectId: patient.id, ip: info.ip, userAgent: info.userAgent, data: { expiresAt } },
      transaction,
    );
    // In the language staff registered for the patient.
    const t = emailTranslator(patient.language);
    const { html, text } = await renderEmail(createElement(PatientInvitationEmail, {
      t,
      url: signInLink(token, account.email),
      patientName: account.name ?? account.email,
      clinicName: clinic.name,
      clinicAddress: clinic.address,
      clinicPhone: clinic.phone ? displayPhone(clinic.phone) || clinic.phone : null,
      hours: INVITATION_HOURS,
    }));
    // Sent last, inside the transaction: when the mail server refuses, nothing is recorded and staff can retry.
    await mailTransport().sendMail({ from: mailFrom(), to: account.email, subject: t("invitation.subject", { clinic: clinic.name }), html, text });
    return { expiresAt };
  });
}

/** Called on every successful sign-in: staff see when a patient first and last signed in. */
export async function recordPatientSignIn(userId: string, now = new Date()): Promise<void> {
  await sequelize.query(
    `UPDATE patients SET first_signed_in_at = coalesce(first_signed_in_at, $2), last_signed_in_at = $2 WHERE user_id = $1`,
    { bind: [userId, now] },
  );
}
