// A patient's copy of everything the clinic holds about them (right of access: PIPEDA Schedule 1
// principle 4.9, GDPR Article 15): one JSON of their data plus the sealed consent PDFs and their documents.
import "server-only";
import JSZip from "jszip";
import { QueryTypes } from "sequelize";
import {
  Appointment, Clinic, Consent, ConsentPdf, Material, PatientDocument, Proposal, ProposalMaterial, User, sequelize,
} from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { patientOf } from "@/lib/data/access";
import { ALLOWED_CONTENT } from "@/lib/domain/documents";
import { getObjectBytes } from "@/lib/storage/s3";
import { recordAudit } from "@/lib/server/audit";

export const EXPORT_FORMAT = "cuspal-patient-records/1";

function fileSafe(text: string): string {
  return text.normalize("NFC").replace(/[^\p{L}\p{N} ._-]+/gu, " ").replace(/\s+/g, "-").slice(0, 60) || "file";
}

/** The ZIP's bytes and a file name. Audited (ids only). */
export async function exportMyRecords({ user, info = {}, now = new Date() }: {
  user: SessionUser; info?: { ip?: string | null; userAgent?: string | null }; now?: Date;
}): Promise<{ zip: Uint8Array; fileName: string }> {
  const patient = await patientOf(user);
  const [account, clinic, proposals, visits, consents, documents, emails, invitations] = await Promise.all([
    User.findByPk(patient.userId, { attributes: ["name", "email", "createdAt"] }),
    Clinic.findByPk(patient.clinicId, { attributes: ["name", "address", "phone"] }),
    Proposal.findAll({
      where: { patientId: patient.id },
      include: [
        { model: ProposalMaterial, as: "options", include: [{ model: Material, as: "material", attributes: ["name"] }] },
        { model: User, as: "dentist", attributes: ["name"] },
      ],
      order: [["createdAt", "ASC"]],
    }),
    Appointment.findAll({ where: { patientId: patient.id }, include: [{ model: Material, as: "material", attributes: ["name"] }], order: [["startsAt", "ASC"]] }),
    Consent.findAll({
      where: { patientId: patient.id },
      attributes: { exclude: ["signaturePng"] },
      include: [{ model: ConsentPdf, as: "pdfs" }],
      order: [["createdAt", "ASC"]],
    }),
    PatientDocument.findAll({ where: { patientId: patient.id }, order: [["createdAt", "ASC"]] }),
    sequelize.query<{ kind: string; appointment_id: string; sent_at: Date | null; due_at: Date }>(
      `SELECT o.kind, o.appointment_id, s.sent_at, o.due_at
         FROM mail_outbox o JOIN appointments a ON a.id = o.appointment_id
         LEFT JOIN mail_sends s ON s.outbox_id = o.id AND s.state = 'sent'
        WHERE a.patient_id = $1 AND o.state = 'sent' ORDER BY coalesce(s.sent_at, o.due_at)`,
      { bind: [patient.id], type: QueryTypes.SELECT },
    ),
    sequelize.query<{ sent_at: Date; expires_at: Date }>(
      `SELECT sent_at, expires_at FROM patient_invitations WHERE patient_id = $1 ORDER BY sent_at`,
      { bind: [patient.id], type: QueryTypes.SELECT },
    ),
  ]);

  const zip = new JSZip();
  const consentRecords = consents.map((c) => ({
    id: c.id,
    visitId: c.appointmentId,
    status: c.status,
    templateVersion: c.templateVersion,
    consentText: c.consentText,
    textSha256: c.textSha256,
    answers: c.answers,
    healthFlags: c.flags,
    acknowledgedSections: c.acknowledged,
    typedName: c.typedName,
    signedAt: c.signedAt,
    reviewedAt: c.reviewedAt,
    withdrawnAt: c.withdrawnAt,
    withdrawnReason: c.withdrawnReason,
    pdfs: (c.pdfs ?? []).sort((a, b) => a.version - b.version).map((pdf) => {
      const path = `consents/consent-${c.id}-v${pdf.version}-${pdf.reason}.pdf`;
      zip.file(path, pdf.pdf, { binary: true, date: pdf.createdAt });
      return { version: pdf.version, reason: pdf.reason, sha256: pdf.sha256, createdAt: pdf.createdAt, file: path };
    }),
  }));

  const documentRecords = [];
  for (const d of documents) {
    const bytes = await getObjectBytes(d.objectKey);
    const path = `documents/${d.id}-${fileSafe(d.title)}.${ALLOWED_CONTENT[d.contentType].ext}`;
    if (bytes) zip.file(path, bytes, { binary: true, date: d.createdAt });
    documentRecords.push({
      id: d.id, kind: d.kind, title: d.title, contentType: d.contentType, byteSize: d.byteSize, sha256: d.sha256,
      uploadedBy: d.uploaderRole, uploadedAt: d.createdAt, file: bytes ? path : null,
      ...(bytes ? {} : { note: "The file could not be read from storage when this copy was made; ask the clinic for it." }),
    });
  }

  const data = {
    format: EXPORT_FORMAT,
    exportedAt: now.toISOString(),
    clinic: { name: clinic?.name, address: clinic?.address, phone: clinic?.phone },
    profile: {
      id: patient.id,
      name: account?.name ?? null,
      email: account?.email ?? null,
      dateOfBirth: patient.dateOfBirth,
      phone: patient.phone,
      language: patient.language,
      address: patient.address,
      reminders: patient.reminders,
      registeredAt: patient.createdAt,
      firstSignedInAt: patient.firstSignedInAt,
      lastSignedInAt: patient.lastSignedInAt,
    },
    proposals: proposals.map((p) => ({
      id: p.id, tooth: p.tooth, feeCents: p.feeCents, note: p.note, status: p.status, createdAt: p.createdAt,
      dentist: p.dentist?.name ?? null,
      materials: (p.options ?? []).map((o) => ({ name: o.material?.name ?? null, finishingModes: o.modes })),
    })),
    visits: visits.map((v) => ({
      id: v.id, proposalId: v.proposalId, status: v.status, startsAt: v.startsAt, endsAt: v.endsAt, tooth: v.tooth,
      material: v.material?.name ?? null, finishingMode: v.mode, feeCents: v.feeCents, statusReason: v.statusReason,
      remindersEnabled: v.remindersEnabled, createdAt: v.createdAt,
    })),
    consents: consentRecords,
    documents: documentRecords,
    emailsSent: [
      ...invitations.map((i) => ({ kind: "invitation", sentAt: i.sent_at, visitId: null })),
      ...emails.map((e) => ({ kind: e.kind, sentAt: e.sent_at ?? e.due_at, visitId: e.appointment_id })),
    ],
  };
  zip.file("records.json", JSON.stringify(data, null, 2));
  zip.file(
    "README.txt",
    [
      `Your records held by ${clinic?.name ?? "your clinic"}, copied on ${now.toISOString()}.`,
      "records.json holds your details, crown proposals, visits, consent records, the list of your documents and the e-mails sent to you.",
      "The consents folder holds each sealed consent PDF; its SHA-256 fingerprint is listed in records.json.",
      "The documents folder holds the files you or the clinic uploaded.",
      "",
    ].join("\n"),
  );
  const bytes = await zip.generateAsync({ type: "uint8array", compression: "DEFLATE" });
  await recordAudit({
    clinicId: patient.clinicId, actorUserId: user.id, action: "patient.records_exported", subjectType: "patient", subjectId: patient.id,
    ip: info.ip, userAgent: info.userAgent,
    data: { consents: consentRecords.length, documents: documentRecords.length, bytes: bytes.byteLength },
  });
  return { zip: bytes, fileName: `cuspal-records-${now.toISOString().slice(0, 10)}.zip` };
}
