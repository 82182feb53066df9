// Staff managing their clinic's patients: register, search, read, correct, archive.
// Every function takes the signed-in staff member and keeps to that member's clinic.
import "server-only";
import type { CountryCode } from "libphonenumber-js";
import { QueryTypes, type Transaction } from "sequelize";
import { Clinic, Patient, User, sequelize } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { nameKey } from "@/lib/domain/consent-schemas";
import { isUuid } from "@/lib/domain/documents";
import {
  DEFAULT_COUNTRY, invitationState, likeContains, localToday, searchTerms,
  type InvitationState, type Language, type PatientSchemaContext, type RegisterPatient, type UpdatePatient,
} from "@/lib/domain/patient-record";
import { recordAudit } from "@/lib/server/audit";
import { AppError, conflict, forbidden, notFound } from "@/lib/server/errors";

type RequestInfo = { ip?: string | null; userAgent?: string | null };

export const PAGE_SIZE = 25;
export const SORTS = ["name", "newest", "birth"] as const;
export type PatientSort = (typeof SORTS)[number];

function staffClinic(user: SessionUser): string {
  if (user.role === "patient" || !user.clinicId) throw forbidden();
  return user.clinicId;
}

/** The clinic's country (settings key `country`, ISO 3166-1 alpha-2) and today's local date, for the patient schemas. */
export async function patientSchemaContext({ clinicId, now = new Date() }: { clinicId: string; now?: Date }): Promise<PatientSchemaContext & { timeZone: string }> {
  const clinic = await Clinic.findByPk(clinicId, { attributes: ["timeZone", "settings"] });
  if (!clinic) throw notFound("That clinic");
  const country = ((clinic.settings as { country?: string } | null)?.country ?? DEFAULT_COUNTRY) as CountryCode;
  return { country, today: localToday(clinic.timeZone, now), timeZone: clinic.timeZone };
}

/** The same person already on file: the same e-mail, or the same folded name with the same date of birth. */
async function findSamePerson(
  clinicId: string,
  { email, name, dateOfBirth }: { email: string; name: string; dateOfBirth: string },
  transaction: Transaction,
  exceptPatientId?: string,
): Promise<AppError | null> {
  const byEmail = await User.findOne({ where: { email }, include: [{ model: Patient, as: "patient", attributes: ["id", "clinicId"] }], transaction });
  const emailPatient = (byEmail as (User & { patient?: Patient }) | null)?.patient;
  if (byEmail && emailPatient?.id !== exceptPatientId) {
    // Someone else's account (another clinic, or staff) is not named: that would reveal it exists there.
    if (emailPatient && emailPatient.clinicId === clinicId) {
      return conflict("A patient with this e-mail address is already registered.", { existingId: emailPatient.id, field: "email" });
    }
    return new AppError(409, "This e-mail address already belongs to another account. Use a different address.", { field: "email", code: "conflict", extra: { field: "email" } });
  }
  const sameBirth = await Patient.findAll({
    where: { clinicId, dateOfBirth },
    include: [{ model: User, as: "user", attributes: ["name"] }],
    transaction,
  });
  const key = nameKey(name);
  const same = sameBirth.find((p) => p.id !== exceptPatientId && nameKey(p.user?.name ?? "") === key);
  if (same) return conflict("A patient with this name and date of birth is already registered.", { existingId: same.id });
  return null;
}

/** Serialises registrations within a clinic, so two desks cannot both add the same person. */
async function lockClinicRegister(clinicId: string, transaction: Transaction) {
  await sequelize.query(`SELECT pg_advisory_xact_lock(hashtext('patient-register:' || $1))`, { bind: [clinicId], transaction });
}

export async function registerPatient({ user, input, info = {} }: { user: SessionUser; input: RegisterPatient; info?: RequestInfo }): Promise<{ id: string }> {
  const clinicId = staffClinic(user);
  return sequelize.transaction(async (transaction) => {
    await lockClinicRegister(clinicId, transaction);
    const dup = await findSamePerson(clinicId, input, transaction);
    if (dup) throw dup;
    const account = await User.create(
      { email: input.email, name: input.name, role: "patient", clinicId, passwordHash: null, emailVerified: null },
      { transaction },
    );
    const patient = await Patient.create(
      {
        userId: account.id, clinicId, dateOfBirth: input.dateOfBirth, phone: input.phone ?? null,
        language: input.language, address: input.address ?? null, reminders: input.reminders,
      },
      { transaction },
    );
    await recordAudit(
      { clinicId, actorUserId: user.id, action: "patient.registered", subjectType: "patient", subjectId: patient.id, ip: info.ip, userAgent: info.userAgent },
      transaction,
    );
    return { id: patient.id };
  });
}

export type PatientListItem = {
  id: string;
  name: string;
  email: string;
  dateOfBirth: string | null;
  phone: string | null;
  language: Language;
  archived: boolean;
};

/**
 * Server-side search: the folded text matches name or e-mail through the trigram index on
 * cuspal_person_key(); digits also match the phone; a YYYY-MM-DD text also matches the date of birth.
 */
export async function searchPatients({
  user, q = "", page = 1, archived = false, sort = "name",
}: { user: SessionUser; q?: string; page?: number; archived?: boolean; sort?: PatientSort }): Promise<{ patients: PatientListItem[]; total: number; page: number; pageSize: number }> {
  const clinicId = staffClinic(user);
  const terms = searchTerms(q);
  const safePage = Number.isInteger(page) && page > 0 ? Math.min(page, 10_000) : 1;
  const order = {
    name: "cuspal_person_key(u.name, u.email), p.id",
    newest: "p.created_at DESC, p.id",
    birth: "p.date_of_birth NULLS LAST, cuspal_person_key(u.name, u.email), p.id",
  }[sort];
  const filters = [`p.clinic_id = $1`, archived ? `p.archived_at IS NOT NULL` : `p.archived_at IS NULL`];
  const bind: unknown[] = [clinicId];
  if (terms.text) {
    bind.push(likeContains(terms.text));
    const textParam = `$${bind.length}`;
    const alternatives = [
      // The same expression as the index, so the planner can use it; unaccent folds the query the same way.
      `p.user_id IN (SELECT id FROM users WHERE cuspal_person_key(name, email) LIKE lower(cuspal_unaccent(${textParam})))`,
    ];
    if (terms.digits) {
      bind.push(likeContains(terms.digits));
      alternatives.push(`p.phone LIKE $${bind.length}`);
    }
    if (terms.date) {
      bind.push(terms.date);
      alternatives.push(`p.date_of_birth = $${bind.length}::date`);
    }
    filters.push(`(${alternatives.join(" OR ")})`);
  }
  bind.push(PAGE_SIZE, (safePage - 1) * PAGE_SIZE);
  const rows = await sequelize.query<{
    id: string; name: string | null; email: string; date_of_birth: string | null; phone: string | null; language: Language; archived_at: Date | null; total: string;
  }>(
    `SELECT p.id, u.name, u.email, to_char(p.date_of_birth, 'YYYY-MM-DD') AS date_of_birth, p.phone, p.language, p.archived_at,
            count(*) OVER () AS total
       FROM patients p JOIN users u ON u.id = p.user_id
      WHERE ${filters.join(" AND ")}
      ORDER BY ${order}
      LIMIT $${bind.length - 1} OFFSET $${bind.length}`,
    { bind, type: QueryTypes.SELECT },
  );
  let total = Number(rows[0]?.total ?? 0);
  if (!rows.length && safePage > 1) {
    // Past the last page: the window count is not there, so count on its own.
    const [c] = await sequelize.query<{ n: string }>(
      `SELECT count(*) AS n FROM patients p JOIN users u ON u.id = p.user_id WHERE ${filters.join(" AND ")}`,
      { bind: bind.slice(0, -2), type: QueryTypes.SELECT },
    );
    total = Number(c?.n ?? 0);
  }
  return {
    patients: rows.map((r) => ({
      id: r.id, name: r.name ?? r.email, email: r.email, dateOfBirth: r.date_of_birth, phone: r.phone, language: r.language, archived: r.archived_at !== null,
    })),
    total,
    page: safePage,
    pageSize: PAGE_SIZE,
  };
}

export type PatientDetails = PatientListItem & {
  address: string | null;
  reminders: boolean;
  archivedAt: Date | null;
  createdAt: Date;
  invitation: InvitationState;
  firstSignedInAt: Date | null;
  lastSignedInAt: Date | null;
};

async function loadClinicPatient(clinicId: string, patientId: string, transaction?: Transaction, lock = false) {
  if (!isUuid(patientId)) throw notFound("That patient");
  // Locked alone: PostgreSQL cannot lock the nullable side of the join an include makes.
  const row = await Patient.findOne({
    where: { id: patientId, clinicId },
    transaction,
    ...(lock && transaction ? { lock: transaction.LOCK.UPDATE } : {}),
  });
  const account = row ? await User.findByPk(row.userId, { transaction }) : null;
  if (!row || !account) throw notFound("That patient");
  row.user = account;
  return row as Patient & { user: User };
}

/** One patient of the staff member's clinic; another clinic's or an unknown id is a 404. */
export async function getPatientDetails({ user, patientId }: { user: SessionUser; patientId: string }): Promise<PatientDetails> {
  const clinicId = staffClinic(user);
  const row = await loadClinicPatient(clinicId, patientId);
  const [latest] = await sequelize.query<{ sent_at: Date; expires_at: Date }>(
    `SELECT sent_at, expires_at FROM patient_invitations WHERE patient_id = $1 ORDER BY sent_at DESC LIMIT 1`,
    { bind: [row.id], type: QueryTypes.SELECT },
  );
  return {
    id: row.id,
    name: row.user.name ?? row.user.email,
    email: row.user.email,
    dateOfBirth: row.dateOfBirth,
    phone: row.phone,
    language: row.language,
    archived: row.archivedAt !== null,
    address: row.address,
    reminders: row.reminders,
    archivedAt: row.archivedAt,
    createdAt: row.createdAt,
    firstSignedInAt: row.firstSignedInAt,
    lastSignedInAt: row.lastSignedInAt,
    invitation: invitationState({
      lastInvitedAt: latest?.sent_at ?? null,
      invitationExpiresAt: latest?.expires_at ?? null,
      firstSignedInAt: row.firstSignedInAt,
      lastSignedInAt: row.lastSignedInAt,
    }),
  };
}

/** Staff correct details, archive (the account can no longer sign in) or unarchive; audited in the same transaction. */
export async function updatePatient({ user, patientId, changes, info = {} }: { user: SessionUser; patientId: string; changes: UpdatePatient; info?: RequestInfo }): Promise<void> {
  const clinicId = staffClinic(user);
  await sequelize.transaction(async (transaction) => {
    await lockClinicRegister(clinicId, transaction);
    const row = await loadClinicPatient(clinicId, patientId, transaction, true);
    const account = row.user;
    const next = {
      name: changes.name ?? account.name ?? "",
      email: changes.email ?? account.email,
      dateOfBirth: changes.dateOfBirth ?? row.dateOfBirth ?? "",
    };
    const identityChanged = next.name !== account.name || next.email !== account.email || next.dateOfBirth !== row.dateOfBirth;
    if (identityChanged && next.dateOfBirth) {
      const dup = await findSamePerson(clinicId, next, transaction, row.id);
      if (dup) throw dup;
    }
    const changed: string[] = [];
    const userValues: Partial<{ name: string; email: string; active: boolean; emailVerified: Date | null }> = {};
    const patientValues: Partial<Pick<Patient, "dateOfBirth" | "phone" | "language" | "address" | "reminders" | "archivedAt">> = {};
    if (changes.name !== undefined && changes.name !== account.name) {
      userValues.name = changes.name;
      changed.push("name");
    }
    if (changes.email !== undefined && changes.email !== account.email) {
      userValues.email = changes.email;
      userValues.emailVerified = null;
      changed.push("email");
    }
    // null clears a field; undefined leaves it.
    const setPatient = <K extends keyof typeof patientValues>(key: K, value: (typeof patientValues)[K] | undefined, current: unknown) => {
      if (value === undefined || (value ?? null) === current) return;
      patientValues[key] = value;
      changed.push(key);
    };
    setPatient("dateOfBirth", changes.dateOfBirth, row.dateOfBirth);
    setPatient("phone", changes.phone === undefined ? undefined : changes.phone ?? null, row.phone);
    setPatient("language", changes.language, row.language);
    setPatient("address", changes.address === undefined ? undefined : changes.address ?? null, row.address);
    setPatient("reminders", changes.reminders, row.reminders);
    let action = "patient.updated";
    if (changes.archived !== undefined && changes.archived !== (row.archivedAt !== null)) {
      // Archiving keeps every record; it only stops the account from signing in.
      patientValues.archivedAt = changes.archived ? new Date() : null;
      userValues.active = !changes.archived;
      action = changes.archived ? "patient.archived" : "patient.unarchived";
      changed.push("archived");
    }
    if (!changed.length) return;
    const oldEmail = account.email;
    if (Object.keys(userValues).length) await account.update(userValues, { transaction });
    if (Object.keys(patientValues).length) await row.update(patientValues, { transaction });
    if (userValues.email) {
      // Links sent to the old address must stop working.
      await sequelize.query(`DELETE FROM verification_tokens WHERE identifier = $1`, { bind: [oldEmail], transaction });
    }
    // Field names only: the values are personal data and the row itself holds them.
    await recordAudit(
      { clinicId, actorUserId: user.id, action, subjectType: "patient", subjectId: row.id, ip: info.ip, userAgent: info.userAgent, data: { fields: changed } },
      transaction,
    );
  });
}
