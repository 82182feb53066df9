// The patient's preferred language: read for every page and e-mail, changed by the patient.
import "server-only";
import { Patient, User, sequelize } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { DEFAULT_LOCALE, isLocale, type Locale } from "@/lib/i18n/locale";
import { recordAudit } from "@/lib/server/audit";
import { forbidden, notFound } from "@/lib/server/errors";

export async function patientLanguage(opts: { userId: string }): Promise<Locale> {
  const patient = await Patient.findOne({ where: { userId: opts.userId }, attributes: ["id", "language"] });
  return isLocale(patient?.language) ? patient.language : DEFAULT_LOCALE;
}

/** The language to write to an e-mail address in: its patient's preference, else English. */
export async function languageForEmail(email: string): Promise<Locale> {
  const user = await User.findOne({ where: { email: email.trim().toLowerCase() }, attributes: ["id"] });
  return user ? patientLanguage({ userId: user.id }) : DEFAULT_LOCALE;
}

/** Saves the signed-in patient's own preference, with its audit event. */
export async function setPatientLanguage(opts: { user: SessionUser; language: Locale; ip: string | null; userAgent: string | null }): Promise<void> {
  if (opts.user.role !== "patient") throw forbidden();
  await sequelize.transaction(async (transaction) => {
    const patient = await Patient.findOne({ where: { userId: opts.user.id }, transaction, lock: transaction.LOCK.UPDATE });
    if (!patient) throw notFound("Your patient record");
    if (patient.language === opts.language) return;
    const from = patient.language;
    await patient.update({ language: opts.language }, { transaction });
    await recordAudit(
      {
        clinicId: patient.clinicId, actorUserId: opts.user.id, action: "patient.language_changed", subjectType: "patient", subjectId: patient.id,
        ip: opts.ip, userAgent: opts.userAgent, data: { from, to: opts.language },
      },
      transaction,
    );
  });
}
