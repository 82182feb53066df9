// Data access for informed consent: who may see or change which consent, then the core steps
// in lib/consent/record.ts inside one transaction with their audit events.
import { isLocale, type Locale } from "@/lib/i18n/locale";
import { materialName } from "@/lib/i18n/material-texts";
import { toothLabel } from "@/lib/i18n/tooth-words";
import { jurisdictionOf } from "@/lib/domain/jurisdiction";
import "server-only";
import { Op, QueryTypes, type Transaction } from "sequelize";
import { z } from "zod";
import {
  Appointment, Clinic, Consent, ConsentPdf, ConsentTemplate, Material, Patient, User, sequelize,
} from "@/db/models";
import { CONSENT_STATUSES, type ConsentStatus } from "@/db/models/consent";
import type { SessionUser } from "@/lib/auth/session";
import {
  consentForVisit, ensureLiveConsent, issuePdf, liveConsent, loadVisitContext, patientName, pdfFilename, publishedTemplate,
  recordReview, recordSignature, type VisitContext,
} from "@/lib/consent/record";
import { decodeSignature } from "@/lib/consent/signature";
import { sha256Hex } from "@/lib/domain/consent-hash";
import { decodeCursor, encodeCursor } from "@/lib/domain/list-cursor";
import { answerLines, type ConsentFlag } from "@/lib/domain/consent-questionnaire";
import { nameKey, templateFormSchema, type SignConsentInput } from "@/lib/domain/consent-schemas";
import { parseConsentText, templateProblems, type AssembledConsent, type TemplateSection } from "@/lib/domain/consent-text";
import { describeTooth } from "@/lib/domain/tooth";
import { addDays, localDate, zonedTime } from "@/lib/domain/time-zone";
import type { AppointmentStatus } from "@/lib/domain/types";
import { sendConsentCopy } from "@/lib/mail/consent-copy";
import { recordAudit } from "@/lib/server/audit";
import { AppError, badRequest, conflict, forbidden, notFound, unprocessable } from "@/lib/server/errors";

/** Visits whose consent can still be signed or withdrawn: treatment has not started. */
const OPEN_STATUSES: AppointmentStatus[] = ["requested", "confirmed", "checked_in"];
const STAFF = ["reception", "dentist", "admin"];

type Client = { ip: string; userAgent: string };
const isUuid = (id: string) => z.uuid().safeParse(id).success;

async function patientOf(user: SessionUser, transaction?: Transaction): Promise<Patient | null> {
  if (user.role !== "patient") return null;
  return Patient.findOne({ where: { userId: user.id }, transaction });
}

/** The visit if this user may see it: a patient their own, staff their clinic's. Otherwise null. */
async function visitFor(user: SessionUser, appointmentId: string, transaction?: Transaction, lock = false): Promise<Appointment | null> {
  if (!isUuid(appointmentId)) return null;
  const lockOpt = lock && transaction ? { lock: transaction.LOCK.UPDATE } : {};
  if (user.role === "patient") {
    const patient = await patientOf(user, transaction);
    if (!patient) return null;
    return Appointment.findOne({ where: { id: appointmentId, patientId: patient.id }, transaction, ...lockOpt });
  }
  if (!STAFF.includes(user.role) || !user.clinicId) return null;
  return Appointment.findOne({ where: { id: appointmentId, clinicId: user.clinicId }, transaction, ...lockOpt });
}

/** The consent if this user may see it (same rule as the visit). */
async function consentFor(user: SessionUser, consentId: string, transaction?: Transaction, lock = false): Promise<Consent | null> {
  if (!isUuid(consentId)) return null;
  const lockOpt = lock && transaction ? { lock: transaction.LOCK.UPDATE } : {};
  if (user.role === "patient") {
    const patient = await patientOf(user, transaction);
    if (!patient) return null;
    return Consent.findOne({ where: { id: consentId, patientId: patient.id }, transaction, ...lockOpt });
  }
  if (!STAFF.includes(user.role) || !user.clinicId) return null;
  return Consent.findOne({ where: { id: consentId, clinicId: user.clinicId }, transaction, ...lockOpt });
}

export type PdfVersionSummary = { version: number; reason: "signed" | "reviewed"; sha256: string; createdAt: Date };

async function pdfVersions(consentId: string): Promise<PdfVersionSummary[]> {
  const rows = await ConsentPdf.findAll({ where: { consentId }, attributes: ["version", "reason", "sha256", "createdAt"], order: [["version", "ASC"]] });
  return rows.map((r) => ({ version: r.version, reason: r.reason, sha256: r.sha256, createdAt: r.createdAt }));
}

function visitSummary(ctx: VisitContext, language: Locale = "en") {
  return {
    id: ctx.visit.id,
    status: ctx.visit.status,
    startsAt: ctx.visit.startsAt,
    timeZone: ctx.clinic.timeZone,
    tooth: toothLabel(ctx.visit.tooth, language),
    material: materialName(ctx.material, language),
    mode: ctx.visit.mode,
    dentist: ctx.dentist.name ?? ctx.dentist.email,
    patient: patientName(ctx),
    clinic: ctx.clinic.name,
  };
}

/**
 * The patient's consent screen for one visit. Opening it while the consent can be signed makes
 * sure a pending record exists and records the opening in the audit trail.
 */
export async function openConsentForPatient({ user, appointmentId, ip, userAgent }: { user: SessionUser; appointmentId: string } & Client) {
  const visit = await visitFor(user, appointmentId);
  if (!visit || user.role !== "patient") return null;
  const ctx = await loadVisitContext(visit);
  let live = await liveConsent(visit.id);
  const canSign = OPEN_STATUSES.includes(visit.status) && (!live || live.status === "pending");
  let form: { templateId: string; templateVersion: number; textSha256: string; document: AssembledConsent } | null = null;
  if (canSign) {
    const template = await publishedTemplate(visit.clinicId);
    live = await sequelize.transaction(async (t) => {
      const consent = await ensureLiveConsent(visit, t);
      await recordAudit(
        { clinicId: visit.clinicId, actorUserId: user.id, action: "consent.viewed", subjectType: "consent", subjectId: consent.id, ip, userAgent, data: { appointmentId: visit.id, templateVersion: template.version } },
        t,
      );
      return consent;
    });
    const { document, textSha256 } = consentForVisit(template, ctx);
    form = { templateId: template.id, templateVersion: template.version, textSha256, document };
  }
  const withdrawn = await Consent.findAll({ where: { appointmentId: visit.id, status: "withdrawn" }, order: [["withdrawnAt", "DESC"]] });
  const signed = live && live.status !== "pending" && live.consentText ? live : null;
  return {
    visit: visitSummary(ctx, isLocale(ctx.patient.language) ? ctx.patient.language : "en"),
    patientName: patientName(ctx),
    /** How the clinic keeps health information, under its jurisdiction, in the patient's language. */
    privacy: jurisdictionOf(ctx.clinic.jurisdiction).privacy[ctx.patient.language === "fr" ? "fr" : "en"],
    consent: live ? { id: live.id, status: live.status as ConsentStatus, signedAt: live.signedAt, reviewedAt: live.reviewedAt, typedName: live.typedName } : null,
    signedDocument: signed ? parseConsentText(signed.consentText!) : null,
    pdfVersions: signed ? await pdfVersions(signed.id) : [],
    canWithdraw: !!signed && OPEN_STATUSES.includes(visit.status) && visit.startsAt.getTime() > Date.now(),
    form,
    withdrawn: withdrawn.map((c) => ({ id: c.id, signedAt: c.signedAt, withdrawnAt: c.withdrawnAt! })),
  };
}

export type SignResult = { consentId: string; status: ConsentStatus; signedAt: Date; pdf: Buffer; filename: string; appointmentId: string };

/** Signs the visit's consent: checks, stores the proof, issues the sealed PDF, all or nothing. */
export async function signConsent({ user, input, ip, userAgent, now = new Date() }: { user: SessionUser; input: SignConsentInput; now?: Date } & Client): Promise<SignResult> {
  if (user.role !== "patient") throw forbidden("Only the patient can sign their consent.");
  // Decode and judge the drawing before touching the database.
  const signaturePng = await decodeSignature(input.signature);
  return sequelize.transaction(async (t) => {
    const visit = await visitFor(user, input.appointmentId, t, true);
    if (!visit) throw notFound("That visit");
    if (!OPEN_STATUSES.includes(visit.status)) throw conflict("This visit can no longer be signed for: treatment has started, or the visit was cancelled.");
    const template = await ConsentTemplate.findOne({ where: { id: input.templateId, clinicId: visit.clinicId }, transaction: t });
    if (!template) throw new AppError(422, "That consent text was not found. Please reload the page.", { field: "templateId" });
    if (template.status !== "published") {
      throw new AppError(409, "This consent text has been replaced by a newer version. Please reload the page, read the new text and sign again.", { field: "templateId" });
    }
    const ctx = await loadVisitContext(visit, t);
    if (consentForVisit(template, ctx).textSha256 !== input.textSha256) {
      throw new AppError(409, "The consent text or the visit's details changed while you were reading. Please reload the page and read it again.", { field: "textSha256" });
    }
    const expected = patientName(ctx);
    if (nameKey(input.typedName) !== nameKey(expected)) {
      throw unprocessable(`Type your full name as the clinic has it: ${expected}.`, "typedName");
    }
    const consent = await ensureLiveConsent(visit, t);
    if (consent.status !== "pending") throw conflict("This consent is already signed.");
    await recordSignature(consent, ctx, {
      template, answers: input.answers, acknowledged: input.acknowledged, typedName: input.typedName.trim(), signaturePng,
      at: now, ip, userAgent, actorUserId: user.id,
    }, t);
    const pdf = await issuePdf(consent, ctx, "signed", t);
    // The patient's copy goes into the mail outbox in this transaction: sent only if the signature commits.
    await sendConsentCopy({ appointmentId: visit.id, pdf: pdf.pdf, filename: pdfFilename(ctx, pdf.version), transaction: t });
    return { consentId: consent.id, status: consent.status, signedAt: consent.signedAt!, pdf: pdf.pdf, filename: pdfFilename(ctx, pdf.version), appointmentId: visit.id };
  });
}

/** The patient (or staff, when the patient tells the clinic) withdraws consent before treatment. */
export async function withdrawConsent({ user, consentId, reason, ip, userAgent, now = new Date() }: { user: SessionUser; consentId: string; reason?: string; now?: Date } & Client) {
  return sequelize.transaction(async (t) => {
    const consent = await consentFor(user, consentId, t, true);
    if (!consent) throw notFound("That consent");
    if (consent.status === "withdrawn") throw conflict("This consent is already withdrawn.");
    if (consent.status === "pending") throw conflict("This consent is not signed yet, so there is nothing to withdraw.");
    const visit = await Appointment.findByPk(consent.appointmentId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!visit || !OPEN_STATUSES.includes(visit.status) || visit.startsAt <= now) {
      throw conflict("Consent can be withdrawn here only before the visit starts. Please speak to your dentist.");
    }
    await consent.update({ status: "withdrawn", withdrawnAt: now, withdrawnBy: user.id, withdrawnReason: reason?.trim() || null }, { transaction: t });
    await recordAudit(
      { clinicId: consent.clinicId, actorUserId: user.id, action: "consent.withdrawn", subjectType: "consent", subjectId: consent.id, ip, userAgent, data: { appointmentId: consent.appointmentId } },
      t,
    );
    return { id: consent.id, status: consent.status as ConsentStatus, withdrawnAt: now, appointmentId: consent.appointmentId };
  });
}

/** The dentist's chairside attestation: reviewed, with a new sealed PDF version that records it. */
export async function reviewConsent({ user, consentId, ip, userAgent, now = new Date() }: { user: SessionUser; consentId: string; now?: Date } & Client) {
  if (user.role !== "dentist") throw forbidden("Only a dentist can mark a consent as reviewed.");
  return sequelize.transaction(async (t) => {
    const consent = await consentFor(user, consentId, t, true);
    if (!consent) throw notFound("That consent");
    if (consent.status === "reviewed") throw conflict("This consent is already reviewed.");
    if (consent.status !== "signed") throw conflict("Only a signed consent can be reviewed.");
    const visit = await Appointment.findByPk(consent.appointmentId, { transaction: t });
    if (!visit) throw notFound("That visit");
    await recordReview(consent, user, now, ip, userAgent, t);
    const ctx = await loadVisitContext(visit, t);
    const pdf = await issuePdf(consent, ctx, "reviewed", t);
    return { id: consent.id, status: consent.status as ConsentStatus, reviewedAt: now, pdfVersion: pdf.version };
  });
}

export const CONSENT_PAGE = { size: 50, max: 100 };

export type ConsentListItem = {
  id: string;
  appointmentId: string;
  status: ConsentStatus;
  signedAt: Date | null;
  createdAt: Date;
  visitStartsAt: Date;
  patient: string;
};

/**
 * One page of the clinic's consents, newest first: by when each was signed (or, not yet signed,
 * created), then by id, so rows sharing a time keep one order across pages. `cursor` is the
 * `nextCursor` of the page before; `nextCursor` is null on the last page.
 */
export async function listConsents({ user, status, limit = CONSENT_PAGE.size, cursor }: { user: SessionUser; status?: string | null; limit?: number; cursor?: string | null }) {
  if (!STAFF.includes(user.role) || !user.clinicId) throw forbidden();
  if (status && !(CONSENT_STATUSES as readonly string[]).includes(status)) {
    throw badRequest(`Status must be one of: ${CONSENT_STATUSES.join(", ")}.`, "status");
  }
  if (!Number.isInteger(limit) || limit < 1 || limit > CONSENT_PAGE.max) throw badRequest(`Limit must be a whole number from 1 to ${CONSENT_PAGE.max}.`, "limit");
  const after = cursor ? decodeCursor(cursor) : null;
  if (cursor && !after) throw badRequest("That page link is not valid. Start again from the newest consents.", "cursor");
  const bind: unknown[] = [user.clinicId];
  const param = (v: unknown) => `$${bind.push(v)}`;
  // The row comparison and the order match the (clinic_id[, status], listed time, id) indexes of
  // migration 0017, read backwards: a page costs its own rows, however many came before.
  const rows = await sequelize.query<ConsentListItem & { listedAt: string }>(
    `SELECT k.id, k.appointment_id AS "appointmentId", k.status, k.signed_at AS "signedAt", k.created_at AS "createdAt",
            a.starts_at AS "visitStartsAt", coalesce(u.name, u.email) AS patient,
            to_char(coalesce(k.signed_at, k.created_at) AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"') AS "listedAt"
       FROM consents k
       JOIN appointments a ON a.id = k.appointment_id
       JOIN patients p ON p.id = k.patient_id
       JOIN users u ON u.id = p.user_id
      WHERE k.clinic_id = $1
        ${status ? `AND k.status = ${param(status)}` : ""}
        ${after ? `AND (coalesce(k.signed_at, k.created_at), k.id) < (${param(after.at)}::timestamptz, ${param(after.id)}::uuid)` : ""}
      ORDER BY coalesce(k.signed_at, k.created_at) DESC, k.id DESC
      LIMIT ${param(limit + 1)}`,
    { bind, type: QueryTypes.SELECT },
  );
  const page = rows.slice(0, limit);
  const last = page.at(-1);
  return {
    consents: page.map((c): ConsentListItem => ({
      id: c.id, appointmentId: c.appointmentId, status: c.status, signedAt: c.signedAt, createdAt: c.createdAt, visitStartsAt: c.visitStartsAt, patient: c.patient,
    })),
    nextCursor: rows.length > limit && last ? encodeCursor({ at: last.listedAt, id: last.id }) : null,
  };
}

/** A sealed PDF of a consent: the latest version unless one is asked for. */
export async function consentPdfFor({ user, consentId, version }: { user: SessionUser; consentId: string; version?: number }) {
  const consent = await consentFor(user, consentId);
  if (!consent) throw notFound("That consent");
  const row = await ConsentPdf.findOne({
    where: { consentId: consent.id, ...(version ? { version } : {}) },
    order: [["version", "DESC"]],
  });
  if (!row) throw notFound(version ? "That PDF version" : "A PDF for that consent");
  const visit = await Appointment.findByPk(consent.appointmentId);
  const date = visit ? visit.startsAt.toISOString().slice(0, 10) : "visit";
  return { pdf: row.pdf, filename: `consent-tooth-${visit?.tooth ?? ""}-${date}-v${row.version}.pdf`, version: row.version };
}

/** Whether these exact bytes are a sealed consent PDF this clinic issued. */
export async function verifyConsentPdf({ user, bytes }: { user: SessionUser; bytes: Uint8Array }) {
  if (!STAFF.includes(user.role) || !user.clinicId) throw forbidden();
  const sha256 = sha256Hex(bytes);
  const rows = await ConsentPdf.findAll({ where: { sha256 }, attributes: ["consentId", "version"] });
  const own = rows.length
    ? await Consent.findOne({ where: { id: { [Op.in]: rows.map((r) => r.consentId) }, clinicId: user.clinicId }, attributes: ["id"] })
    : null;
  const row = own ? rows.find((r) => r.consentId === own.id) : undefined;
  return row ? { match: true as const, consentId: row.consentId, version: row.version, sha256 } : { match: false as const, sha256 };
}

export type ChairsideRow = {
  appointmentId: string;
  startsAt: Date;
  visitStatus: AppointmentStatus;
  patient: string;
  tooth: string;
  material: string;
  dentist: string;
  consentId: string | null;
  consentStatus: ConsentStatus;
  flags: ConsentFlag[];
};

/** Today's visits in the clinic's own time zone, with each one's consent status and flags. */
export async function todaysVisits({ user, now = new Date() }: { user: SessionUser; now?: Date }) {
  if (!STAFF.includes(user.role) || !user.clinicId) throw forbidden();
  const clinic = await Clinic.findByPk(user.clinicId);
  if (!clinic) throw notFound("Your clinic");
  const day = localDate(now, clinic.timeZone);
  const from = zonedTime(day, "00:00", clinic.timeZone);
  const to = zonedTime(addDays(day, 1), "00:00", clinic.timeZone);
  const visits = await Appointment.findAll({
    where: { clinicId: clinic.id, startsAt: { [Op.gte]: from, [Op.lt]: to }, status: { [Op.notIn]: ["declined", "cancelled"] } },
    include: [
      { model: Patient, as: "patient", include: [{ model: User, as: "user", attributes: ["name", "email"] }] },
      { model: Material, as: "material", attributes: ["name"] },
      { model: User, as: "dentist", attributes: ["name", "email"] },
    ],
    order: [["startsAt", "ASC"]],
  });
  const consents = await Consent.findAll({
    where: { appointmentId: { [Op.in]: visits.map((v) => v.id) }, status: { [Op.ne]: "withdrawn" } },
    attributes: ["id", "appointmentId", "status", "flags"],
  });
  const byVisit = new Map(consents.map((c) => [c.appointmentId, c]));
  const rows: ChairsideRow[] = visits.map((v) => {
    const c = byVisit.get(v.id);
    const dentist = (v as Appointment & { dentist?: User }).dentist;
    return {
      appointmentId: v.id,
      startsAt: v.startsAt,
      visitStatus: v.status,
      patient: v.patient?.user?.name ?? v.patient?.user?.email ?? "Patient",
      tooth: describeTooth(v.tooth).label,
      material: v.material?.name ?? "",
      dentist: dentist?.name ?? dentist?.email ?? "",
      consentId: c?.id ?? null,
      consentStatus: (c?.status ?? "pending") as ConsentStatus,
      flags: c && c.status !== "pending" ? c.flags : [],
    };
  });
  return { day, timeZone: clinic.timeZone, clinicName: clinic.name, rows };
}

/** The chairside view of one visit's consent for staff. */
export async function staffConsentView({ user, appointmentId }: { user: SessionUser; appointmentId: string }) {
  if (!STAFF.includes(user.role)) return null;
  const visit = await visitFor(user, appointmentId);
  if (!visit) return null;
  const ctx = await loadVisitContext(visit);
  const live = await liveConsent(visit.id);
  const withdrawn = await Consent.findAll({ where: { appointmentId: visit.id, status: "withdrawn" }, order: [["withdrawnAt", "DESC"]] });
  const reviewer = live?.reviewedBy ? await User.findByPk(live.reviewedBy, { attributes: ["name", "email"] }) : null;
  const signed = live && live.status !== "pending" ? live : null;
  return {
    visit: visitSummary(ctx),
    consent: live
      ? {
          id: live.id,
          status: live.status as ConsentStatus,
          signedAt: live.signedAt,
          typedName: live.typedName,
          templateVersion: live.templateVersion,
          textSha256: live.textSha256,
          language: live.language,
          reviewedAt: live.reviewedAt,
          reviewer: reviewer ? reviewer.name ?? reviewer.email : null,
          flags: signed ? live.flags : [],
          answers: signed && live.answers ? answerLines(live.answers) : [],
        }
      : null,
    pdfVersions: signed ? await pdfVersions(signed.id) : [],
    canReview: user.role === "dentist" && live?.status === "signed",
    withdrawn: withdrawn.map((c) => ({ id: c.id, signedAt: c.signedAt, withdrawnAt: c.withdrawnAt!, reason: c.withdrawnReason, via: c.withdrawnVia, byName: c.withdrawnByName })),
  };
}

export async function listTemplateVersions({ user }: { user: SessionUser }) {
  if (user.role !== "admin" || !user.clinicId) throw forbidden();
  await publishedTemplate(user.clinicId);
  const rows = await ConsentTemplate.findAll({ where: { clinicId: user.clinicId }, order: [["version", "DESC"]] });
  const signedCounts = await sequelize.query<{ template_id: string; n: string }>(
    "SELECT template_id, count(*) AS n FROM consents WHERE clinic_id = $1 AND template_id IS NOT NULL GROUP BY template_id",
    { bind: [user.clinicId], type: QueryTypes.SELECT },
  );
  const counts = new Map(signedCounts.map((r) => [r.template_id, Number(r.n)]));
  const clinic = await Clinic.findByPk(user.clinicId, { attributes: ["timeZone"] });
  return {
    timeZone: clinic?.timeZone ?? "UTC",
    versions: rows.map((r) => ({
      id: r.id, version: r.version, title: r.title, status: r.status, publishedAt: r.publishedAt, withdrawnAt: r.withdrawnAt,
      sections: r.sections as TemplateSection[], signedCount: counts.get(r.id) ?? 0,
      titleFr: r.titleFr, sectionsFr: r.sectionsFr as TemplateSection[] | null,
    })),
  };
}

export type PublishResult = { ok: true; version: number } | { ok: false; error: string; field?: string };

/** Publishes edited text as the next version; the version in use is withdrawn in the same transaction. */
export async function publishTemplateVersion({ user, values, ip, userAgent }: { user: SessionUser; values: unknown } & Client): Promise<PublishResult> {
  if (user.role !== "admin" || !user.clinicId) throw forbidden();
  const parsed = templateFormSchema.safeParse(values);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { ok: false, error: issue?.message ?? "The consent text is not valid.", field: issue?.path.join(".") };
  }
  const fr = parsed.data.fr;
  const problems = [...templateProblems(parsed.data), ...templateProblems(fr).map((p) => ({ ...p, field: `fr.${p.field}` }))];
  if (problems.length) return { ok: false, error: problems[0].message, field: problems[0].field };
  const clinicId = user.clinicId;
  const version = await sequelize.transaction(async (t) => {
    // Lock the clinic row so two managers publishing at once get consecutive versions.
    await Clinic.findByPk(clinicId, { transaction: t, lock: t.LOCK.UPDATE });
    const current = await ConsentTemplate.findOne({ where: { clinicId, status: "published" }, transaction: t });
    const last = (await ConsentTemplate.max<number, ConsentTemplate>("version", { where: { clinicId }, transaction: t })) ?? 0;
    if (current) await current.update({ status: "withdrawn", withdrawnAt: new Date() }, { transaction: t });
    const created = await ConsentTemplate.create(
      { clinicId, version: last + 1, title: parsed.data.title, sections: parsed.data.sections, titleFr: fr.title, sectionsFr: fr.sections, status: "published", createdBy: user.id },
      { transaction: t },
    );
    await recordAudit(
      { clinicId, actorUserId: user.id, action: "consent_template.published", subjectType: "consent_template", subjectId: created.id, ip, userAgent, data: { version: created.version, replaces: current?.version ?? null } },
      t,
    );
    return created.version;
  });
  return { ok: true, version };
}

/** The live consent's status for a visit this user may see (null when they may not see the visit). */
export async function consentStatusForVisit({ user, appointmentId }: { user: SessionUser; appointmentId: string }) {
  const visit = await visitFor(user, appointmentId);
  if (!visit) return null;
  const live = await liveConsent(visit.id);
  return { status: (live?.status ?? "pending") as ConsentStatus, consentId: live?.id ?? null, flags: live && live.status !== "pending" ? live.flags.length : 0, open: OPEN_STATUSES.includes(visit.status) };
}
