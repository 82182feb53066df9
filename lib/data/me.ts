// The signed-in patient's own profile: reading it, changing their phone, language and reminder
// preference, and changing their e-mail address, which waits until a link sent to the new address is followed.
import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { createElement } from "react";
import { QueryTypes } from "sequelize";
import { Clinic, Patient, User, sequelize } from "@/db/models";
import EmailChangeEmail from "@/emails/email-change";
import type { SessionUser } from "@/lib/auth/session";
import { patientOf } from "@/lib/data/access";
import type { Language, UpdateMe } from "@/lib/domain/patient-record";
import { env } from "@/lib/env";
import { emailTranslator } from "@/lib/i18n/email";
import { renderEmail } from "@/lib/mail/render";
import { mailFrom, mailTransport } from "@/lib/mail/transport";
import { recordAudit } from "@/lib/server/audit";
import { AppError } from "@/lib/server/errors";

export const EMAIL_CHANGE_HOURS = 24;

export type MyProfile = {
  name: string | null;
  email: string;
  pendingEmail: string | null;
  dateOfBirth: string | null;
  phone: string | null;
  language: Language;
  address: string | null;
  reminders: boolean;
  clinic: { name: string; country: string };
};

const hashToken = (token: string) => createHash("sha256").update(token).digest("hex");

export async function getMe({ user }: { user: SessionUser }): Promise<MyProfile> {
  const patient = await patientOf(user);
  const [account, clinic, pending] = await Promise.all([
    User.findByPk(patient.userId),
    Clinic.findByPk(patient.clinicId, { attributes: ["name", "settings"] }),
    sequelize.query<{ new_email: string }>(
      `SELECT new_email FROM email_changes WHERE patient_id = $1 AND expires_at > now() ORDER BY created_at DESC LIMIT 1`,
      { bind: [patient.id], type: QueryTypes.SELECT },
    ),
  ]);
  return {
    name: account?.name ?? null,
    email: account?.email ?? user.email,
    pendingEmail: pending[0]?.new_email ?? null,
    dateOfBirth: patient.dateOfBirth,
    phone: patient.phone,
    language: patient.language,
    address: patient.address,
    reminders: patient.reminders,
    clinic: { name: clinic?.name ?? "", country: (clinic?.settings as { country?: string } | null)?.country ?? "CA" },
  };
}

export async function updateMe({ user, changes, info = {} }: { user: SessionUser; changes: UpdateMe; info?: { ip?: string | null; userAgent?: string | null } }): Promise<{ emailPending: boolean }> {
  const patient = await patientOf(user);
  let emailPending = false;
  await sequelize.transaction(async (transaction) => {
    const row = await Patient.findByPk(patient.id, { transaction, lock: transaction.LOCK.UPDATE, rejectOnEmpty: true });
    const account = await User.findByPk(row.userId, { transaction, rejectOnEmpty: true });
    const values: Partial<Pick<Patient, "phone" | "language" | "reminders">> = {};
    if (changes.phone !== undefined && (changes.phone ?? null) !== row.phone) values.phone = changes.phone ?? null;
    if (changes.language !== undefined && changes.language !== row.language) values.language = changes.language;
    if (changes.reminders !== undefined && changes.reminders !== row.reminders) values.reminders = changes.reminders;
    const fields = Object.keys(values);
    if (fields.length) await row.update(values, { transaction });
    if (changes.email && changes.email !== account.email) {
      // Whether the address is free is decided when the link is followed, so this answer never
      // tells a patient that someone else uses an address.
      const token = randomBytes(32).toString("hex");
      await sequelize.query(`DELETE FROM email_changes WHERE patient_id = $1`, { bind: [row.id], transaction });
      await sequelize.query(`INSERT INTO email_changes (token_hash, patient_id, new_email, expires_at) VALUES ($1, $2, $3, now() + make_interval(hours => $4))`, {
        bind: [hashToken(token), row.id, changes.email, EMAIL_CHANGE_HOURS], transaction,
      });
      const url = new URL("/api/me/email", env().APP_URL);
      url.searchParams.set("token", token);
      // In the patient's language as it stands after this change (row.update above already applied it).
      const t = emailTranslator(row.language);
      const { html, text } = await renderEmail(createElement(EmailChangeEmail, { url: url.toString(), hours: EMAIL_CHANGE_HOURS, t }));
      await mailTransport().sendMail({ from: mailFrom(), to: changes.email, subject: t("emailChange.subject"), html, text });
      fields.push("emailRequested");
      emailPending = true;
    }
    if (fields.length) {
      await recordAudit(
        { clinicId: row.clinicId, actorUserId: user.id, action: "patient.self_updated", subjectType: "patient", subjectId: row.id, ip: info.ip, userAgent: info.userAgent, data: { fields } },
        transaction,
      );
    }
  });
  return { emailPending };
}

/** Follows the link sent to a new address. Works without a session: having the link is the proof. */
export async function confirmEmailChange({ token, info = {} }: { token: string; info?: { ip?: string | null; userAgent?: string | null } }): Promise<void> {
  if (!/^[0-9a-f]{64}$/.test(token)) throw new AppError(400, "This confirmation link is not valid.", { code: "bad_link" });
  await sequelize.transaction(async (transaction) => {
    const [change] = await sequelize.query<{ patient_id: string; new_email: string; expires_at: Date }>(
      `DELETE FROM email_changes WHERE token_hash = $1 RETURNING patient_id, new_email, expires_at`,
      { bind: [hashToken(token)], transaction, type: QueryTypes.SELECT },
    );
    if (!change || change.expires_at.getTime() < Date.now()) {
      throw new AppError(410, "This confirmation link has expired or was already used. Ask for the change again from your profile.", { code: "link_expired" });
    }
    const patient = await Patient.findByPk(change.patient_id, { transaction, rejectOnEmpty: true });
    const account = await User.findByPk(patient.userId, { transaction, rejectOnEmpty: true });
    if (await User.findOne({ where: { email: change.new_email }, transaction })) {
      throw new AppError(409, "This e-mail address is already used by another account. Your address was not changed.", { code: "conflict" });
    }
    const oldEmail = account.email;
    await account.update({ email: change.new_email, emailVerified: new Date() }, { transaction });
    await sequelize.query(`DELETE FROM verification_tokens WHERE identifier = $1`, { bind: [oldEmail], transaction });
    await recordAudit(
      { clinicId: patient.clinicId, actorUserId: account.id, action: "patient.email_confirmed", subjectType: "patient", subjectId: patient.id, ip: info.ip, userAgent: info.userAgent },
      transaction,
    );
  });
}
