// The consent record's core steps, shared by the data layer (after it checks who is asking) and
// the demo seed: the visit's facts, the exact text, recording a signature or a review, and
// issuing the sealed PDF version. Every step runs inside the caller's transaction.
import { Op, QueryTypes, type Transaction } from "sequelize";
import {
  Appointment, AuditEvent, Clinic, Consent, ConsentPdf, ConsentTemplate, Material, Patient, User, sequelize,
} from "@/db/models";
import { recordAudit } from "@/lib/server/audit";
import { questionnaireFlags, type ConsentFlag, type QuestionnaireAnswers } from "@/lib/domain/consent-questionnaire";
import { sha256Hex } from "@/lib/domain/consent-hash";
import {
  assembleConsent, consentText, DEFAULT_SECTIONS, DEFAULT_TEMPLATE_TITLE, formatInZone,
  parseConsentText, type AssembledConsent, type SectionKey, type VisitSummary,
} from "@/lib/domain/consent-text";
import { crownWording } from "@/lib/domain/consent-text";
import { visitLengthRange } from "@/lib/domain/timeline";
import { CONSENT_WORDS, type ConsentLanguage } from "@/lib/domain/consent-words";
import { DEFAULT_SECTIONS_FR, DEFAULT_TEMPLATE_TITLE_FR } from "@/lib/domain/consent-text-fr";
import { jurisdictionOf } from "@/lib/domain/jurisdiction";
import { formatConsentDate, formatMoney } from "@/lib/i18n/format";
import { materialName, materialTexts } from "@/lib/i18n/material-texts";
import { toothLabel } from "@/lib/i18n/tooth-words";
import { answerLinesIn } from "@/lib/i18n/questionnaire";
import { buildConsentPdf, type AuditLine } from "./pdf";
import { sealPdf } from "./seal";

export type VisitContext = {
  visit: Appointment;
  clinic: Clinic;
  material: Material;
  patient: Patient;
  patientUser: User;
  dentist: User;
};

export async function loadVisitContext(visit: Appointment, transaction?: Transaction): Promise<VisitContext> {
  // One after another: queries in a transaction share one connection.
  const clinic = await Clinic.findByPk(visit.clinicId, { transaction });
  const material = await Material.findByPk(visit.materialId, { transaction });
  const patient = await Patient.findByPk(visit.patientId, { transaction, include: [{ model: User, as: "user" }] });
  const dentist = await User.findByPk(visit.dentistId, { transaction });
  if (!clinic || !material || !patient?.user || !dentist) throw new Error(`Visit ${visit.id} is missing its clinic, material, patient or dentist.`);
  return { visit, clinic, material, patient, patientUser: patient.user, dentist };
}

export function patientName(ctx: VisitContext): string {
  return ctx.patientUser.name ?? ctx.patientUser.email;
}

export function visitFacts(ctx: VisitContext, language: ConsentLanguage = "en"): VisitSummary {
  const words = CONSENT_WORDS[language];
  return {
    materialClass: ctx.material.iso6872Class,
    dateOfBirth: ctx.patient.dateOfBirth,
    patient: patientName(ctx),
    tooth: toothLabel(ctx.visit.tooth, language),
    material: materialName(ctx.material, language),
    mode: words.modes[ctx.visit.mode] ?? ctx.visit.mode,
    date: formatConsentDate(ctx.visit.startsAt, ctx.clinic.timeZone, language),
    fee: formatMoney(ctx.visit.feeCents, ctx.clinic.currency, language),
    clinic: ctx.clinic.name,
    dentist: ctx.dentist.name ?? words.yourDentist,
    // The booked visit's length is the estimate for this tooth, material and mode.
    length: visitLengthRange(Math.round((ctx.visit.endsAt.getTime() - ctx.visit.startsAt.getTime()) / 60_000), undefined, language).text,
    ...crownWording(ctx.material.provisionalOnly, language),
  };
}

/** The language this patient reads this template version in: theirs, unless the version has no French text. */
export function consentLanguage(template: ConsentTemplate, ctx: VisitContext): ConsentLanguage {
  return ctx.patient.language === "fr" && template.titleFr && template.sectionsFr ? "fr" : "en";
}

/** The exact consent a patient reads for this visit under this template version, and its SHA-256. */
export function consentForVisit(template: ConsentTemplate, ctx: VisitContext): { document: AssembledConsent; text: string; textSha256: string; language: ConsentLanguage } {
  const language = consentLanguage(template, ctx);
  const document = assembleConsent({
    language,
    title: language === "fr" ? template.titleFr! : template.title,
    templateVersion: template.version,
    sections: language === "fr" ? template.sectionsFr! : template.sections,
    facts: visitFacts(ctx, language),
    materialCautions: materialTexts(ctx.material, language).cautions,
    electronicRecords: jurisdictionOf(ctx.clinic.jurisdiction).agreement[language],
  });
  const text = consentText(document);
  return { document, text, textSha256: sha256Hex(text), language };
}

export function flagsFor(answers: QuestionnaireAnswers, ctx: VisitContext): ConsentFlag[] {
  return questionnaireFlags(answers, { name: ctx.material.name, iso6872Class: ctx.material.iso6872Class, cementation: ctx.material.cementation });
}

/** The clinic's published template; a clinic that has none gets the default one published. */
export async function publishedTemplate(clinicId: string, transaction?: Transaction): Promise<ConsentTemplate> {
  const found = await ConsentTemplate.findOne({ where: { clinicId, status: "published" }, transaction });
  if (found) return found;
  // ON CONFLICT: two first visitors at once must not publish two versions.
  await sequelize.query(
    `INSERT INTO consent_templates (clinic_id, version, title, sections, title_fr, sections_fr, status)
     SELECT $1, coalesce(max(version), 0) + 1, $2, $3::jsonb, $4, $5::jsonb, 'published' FROM consent_templates WHERE clinic_id = $1
     ON CONFLICT DO NOTHING`,
    {
      bind: [clinicId, DEFAULT_TEMPLATE_TITLE, JSON.stringify(DEFAULT_SECTIONS), DEFAULT_TEMPLATE_TITLE_FR, JSON.stringify(DEFAULT_SECTIONS_FR)],
      transaction, type: QueryTypes.INSERT,
    },
  );
  const created = await ConsentTemplate.findOne({ where: { clinicId, status: "published" }, transaction });
  if (!created) throw new Error(`Clinic ${clinicId} has no published consent template.`);
  return created;
}

/** The visit's live consent (not withdrawn), optionally locked for update. */
export async function liveConsent(appointmentId: string, transaction?: Transaction, lock = false): Promise<Consent | null> {
  return Consent.findOne({
    where: { appointmentId, status: { [Op.ne]: "withdrawn" } },
    transaction,
    ...(lock && transaction ? { lock: transaction.LOCK.UPDATE } : {}),
  });
}

/** Makes sure the visit has a live consent record; a new one starts pending. */
export async function ensureLiveConsent(visit: Appointment, transaction: Transaction): Promise<Consent> {
  const existing = await liveConsent(visit.id, transaction, true);
  if (existing) return existing;
  await sequelize.query(
    `INSERT INTO consents (clinic_id, appointment_id, patient_id) VALUES ($1, $2, $3) ON CONFLICT DO NOTHING`,
    { bind: [visit.clinicId, visit.id, visit.patientId], transaction, type: QueryTypes.INSERT },
  );
  const created = await liveConsent(visit.id, transaction, true);
  if (!created) throw new Error(`Could not open a consent for visit ${visit.id}.`);
  return created;
}

export type SignatureInput = {
  template: ConsentTemplate;
  answers: QuestionnaireAnswers;
  acknowledged: SectionKey[];
  typedName: string;
  signaturePng: Buffer;
  at: Date;
  ip: string;
  userAgent: string;
  actorUserId: string;
};

/** Stores the signature and its proof on a pending consent, with its audit event. */
export async function recordSignature(consent: Consent, ctx: VisitContext, input: SignatureInput, transaction: Transaction): Promise<Consent> {
  const { text, textSha256, document, language } = consentForVisit(input.template, ctx);
  await consent.update(
    {
      status: "signed",
      templateId: input.template.id,
      templateVersion: input.template.version,
      answers: input.answers,
      flags: flagsFor(input.answers, ctx),
      acknowledged: input.acknowledged,
      electronicRecordsVersion: document.electronicRecords.version,
      consentText: text,
      language,
      textSha256,
      typedName: input.typedName,
      signaturePng: input.signaturePng,
      signedAt: input.at,
      signedIp: input.ip,
      signedUserAgent: input.userAgent,
    },
    { transaction },
  );
  await recordAudit(
    {
      clinicId: consent.clinicId, actorUserId: input.actorUserId, action: "consent.signed", subjectType: "consent", subjectId: consent.id,
      ip: input.ip, userAgent: input.userAgent,
      data: { appointmentId: consent.appointmentId, templateVersion: input.template.version, textSha256, language, flags: consent.flags.length },
    },
    transaction,
  );
  return consent;
}

export async function recordReview(consent: Consent, reviewer: { id: string }, at: Date, ip: string, userAgent: string, transaction: Transaction) {
  await consent.update({ status: "reviewed", reviewedAt: at, reviewedBy: reviewer.id, reviewedIp: ip, reviewedUserAgent: userAgent }, { transaction });
  await recordAudit(
    {
      clinicId: consent.clinicId, actorUserId: reviewer.id, action: "consent.reviewed", subjectType: "consent", subjectId: consent.id,
      ip, userAgent, data: { appointmentId: consent.appointmentId },
    },
    transaction,
  );
}

const EVENT_WORDS: Record<string, string> = {
  "consent.viewed": "Consent opened by the patient",
  "consent.signed": "Consent signed by the patient",
  "consent.reviewed": "Consent reviewed by the dentist",
};

/** The audit events the PDF shows: the first and latest opening before signing, the signature and the review. */
async function auditLines(consent: Consent, timeZone: string, transaction: Transaction): Promise<AuditLine[]> {
  const events = await AuditEvent.findAll({
    where: { subjectType: "consent", subjectId: consent.id, action: { [Op.in]: Object.keys(EVENT_WORDS) } },
    order: [["at", "ASC"], ["id", "ASC"]],
    transaction,
  });
  const views = events.filter((e) => e.action === "consent.viewed" && (!consent.signedAt || e.at <= consent.signedAt));
  const shown = events.filter((e) => e.action !== "consent.viewed" || e === views[0] || e === views[views.length - 1]);
  const actorIds = [...new Set(shown.map((e) => e.actorUserId).filter((id): id is string => !!id))];
  const actors = new Map((await User.findAll({ where: { id: { [Op.in]: actorIds } }, transaction })).map((u) => [u.id, u]));
  return shown
    .filter((e) => e.action !== "consent.viewed" || !consent.signedAt || e.at <= consent.signedAt)
    .map((e) => {
      const actor = e.actorUserId ? actors.get(e.actorUserId) : undefined;
      let event = EVENT_WORDS[e.action];
      if (e.action === "consent.viewed" && views.length > 1) event += e === views[0] ? ` (first of ${views.length} openings)` : ` (latest of ${views.length} openings)`;
      // The signature and the review carry the record's own times; the event is written in the same transaction.
      const at = e.action === "consent.signed" && consent.signedAt ? consent.signedAt : e.action === "consent.reviewed" && consent.reviewedAt ? consent.reviewedAt : e.at;
      return {
        event,
        who: actor ? `${actor.name ?? actor.email} (${actor.role === "admin" ? "clinic manager" : actor.role})` : "the portal",
        at: `${formatInZone(at, timeZone)} · ${at.toISOString()}`,
        ip: e.ip ?? "not recorded",
        userAgent: e.userAgent ?? "not recorded",
      };
    });
}

export function pdfFilename(ctx: VisitContext, version: number): string {
  const date = ctx.visit.startsAt.toISOString().slice(0, 10);
  return `consent-tooth-${ctx.visit.tooth}-${date}-v${version}.pdf`;
}

/** Lays out, seals and stores the next PDF version of a signed (or reviewed) consent. */
export async function issuePdf(consent: Consent, ctx: VisitContext, reason: "signed" | "reviewed", transaction: Transaction): Promise<ConsentPdf> {
  if (!consent.signedAt || !consent.answers || !consent.signaturePng || !consent.consentText) throw new Error(`Consent ${consent.id} is not signed.`);
  const previous = await ConsentPdf.findOne({ where: { consentId: consent.id }, order: [["version", "DESC"]], attributes: ["version", "sha256"], transaction });
  const version = (previous?.version ?? 0) + 1;
  // Every version is laid out from the signed text itself, checked against its stored hash.
  const text = consent.consentText ?? "";
  const textSha256 = sha256Hex(text);
  const document = parseConsentText(text);
  if (textSha256 !== consent.textSha256 || consentText(document) !== text) throw new Error(`Consent ${consent.id}: the stored text does not match its fingerprint.`);
  const zone = ctx.clinic.timeZone;
  const reviewer = consent.reviewedBy ? await User.findByPk(consent.reviewedBy, { transaction }) : null;
  const at = reason === "reviewed" && consent.reviewedAt ? consent.reviewedAt : consent.signedAt;
  const doc = await buildConsentPdf({
    consentId: consent.id,
    pdfVersion: version,
    clinic: { name: ctx.clinic.name, address: ctx.clinic.address },
    patientName: patientName(ctx),
    document,
    acknowledgedAll: (consent.acknowledged ?? []).length === document.sections.length,
    answers: answerLinesIn(consent.answers, document.language),
    flags: consent.flags,
    typedName: consent.typedName ?? "",
    signaturePng: consent.signaturePng,
    signedAt: `${formatConsentDate(consent.signedAt, zone, document.language)} · ${consent.signedAt.toISOString()}`,
    textSha256,
    audit: await auditLines(consent, zone, transaction),
    review: consent.reviewedAt && reviewer ? { by: reviewer.name ?? reviewer.email, at: `${formatConsentDate(consent.reviewedAt, zone, document.language)} · ${consent.reviewedAt.toISOString()}` } : null,
    previous: previous ? { version: previous.version, sha256: previous.sha256 } : null,
    createdAt: at,
  });
  const content = await doc.save({ useObjectStreams: false });
  const sealed = await sealPdf(doc, {
    reason: reason === "signed" ? "Consent signed by the patient" : "Consent reviewed by the dentist",
    clinicName: ctx.clinic.name,
    location: ctx.clinic.address,
    contact: ctx.clinic.phone ?? ctx.clinic.name,
    at,
  });
  const row = await ConsentPdf.create(
    { consentId: consent.id, version, reason, pdf: sealed, contentSha256: sha256Hex(content), sha256: sha256Hex(sealed) },
    { transaction },
  );
  await recordAudit(
    {
      clinicId: consent.clinicId, actorUserId: null, action: "consent.pdf_sealed", subjectType: "consent", subjectId: consent.id,
      data: { version, reason, sha256: row.sha256 },
    },
    transaction,
  );
  return row;
}
