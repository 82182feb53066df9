// Data access for patient documents: who may add, list and open them, and the order of writes
// that keeps the table and the bucket in step (object first, then the row; the object is removed
// again if the row cannot be saved, so there is never a row without its object).
import "server-only";
import { createHash, randomUUID } from "node:crypto";
import { Clinic, Patient, PatientDocument, sequelize, User } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { prepareContent } from "@/lib/documents/content";
import {
  DOCUMENT_KIND_LABEL, downloadName, fileNameProblem, isUuid, mayUploadKind, objectKeyFor,
  type AllowedContentType, type DocumentKind, type UploaderRole,
} from "@/lib/domain/documents";
import { recordAudit } from "@/lib/server/audit";
import { AppError, badRequest, notFound } from "@/lib/server/errors";
import { deleteObject, getObjectStream, putObject } from "@/lib/storage/s3";

export type Actor = Pick<SessionUser, "id" | "role" | "clinicId">;
export type ClientInfo = { ip: string; userAgent: string };

export type DocumentView = {
  id: string;
  kind: DocumentKind;
  kindLabel: string;
  title: string;
  contentType: AllowedContentType;
  byteSize: number;
  uploadedBy: { name: string; role: UploaderRole; isYou: boolean };
  createdAt: string;
};

/** The patient whose documents the actor may touch; anything else is a 404 that says nothing. */
async function patientFor(actor: Actor, patientId: string | undefined): Promise<Patient> {
  if (actor.role === "patient") {
    const own = await Patient.findOne({ where: { userId: actor.id } });
    if (!own || (patientId !== undefined && patientId !== own.id)) throw notFound("That patient");
    return own;
  }
  if (!patientId) throw badRequest("Choose the patient this document belongs to.", "patientId");
  if (!isUuid(patientId) || !actor.clinicId) throw notFound("That patient");
  const patient = await Patient.findOne({ where: { id: patientId, clinicId: actor.clinicId } });
  if (!patient) throw notFound("That patient");
  return patient;
}

export async function createDocument({
  actor, patientId, kind, title, file, client,
}: {
  actor: Actor;
  patientId?: string;
  kind: DocumentKind;
  title: string;
  file: { name: string; bytes: Uint8Array };
  client: ClientInfo;
}): Promise<{ id: string }> {
  const patient = await patientFor(actor, patientId);
  if (!mayUploadKind(actor.role, kind)) {
    throw badRequest(`A ${DOCUMENT_KIND_LABEL[kind].toLowerCase()} is added by the clinic. Choose another kind.`, "kind");
  }
  const nameProblem = fileNameProblem(file.name);
  if (nameProblem) throw badRequest(nameProblem, "file");
  const content = await prepareContent(file.bytes);

  const id = randomUUID();
  const objectKey = objectKeyFor(patient.clinicId, id);
  try {
    await putObject(objectKey, content.bytes, content.contentType);
  } catch (err) {
    console.error(`Storing the object for document ${id} failed:`, err instanceof Error ? err.message : err);
    throw new AppError(503, "We could not store the file just now. Please try again in a moment.", { code: "storage_unavailable" });
  }

  try {
    await sequelize.transaction(async (transaction) => {
      await PatientDocument.create(
        {
          id, clinicId: patient.clinicId, patientId: patient.id, uploadedById: actor.id, uploaderRole: actor.role,
          kind, title, objectKey, contentType: content.contentType, byteSize: content.bytes.byteLength,
          sha256: createHash("sha256").update(content.bytes).digest("hex"),
        },
        { transaction },
      );
      await recordAudit(
        {
          clinicId: patient.clinicId, actorUserId: actor.id, action: "document.uploaded", subjectType: "document", subjectId: id,
          ip: client.ip, userAgent: client.userAgent,
          data: { patientId: patient.id, kind, contentType: content.contentType, byteSize: content.bytes.byteLength },
        },
        transaction,
      );
    });
  } catch (err) {
    await deleteObject(objectKey).catch((cleanup) =>
      console.error(`Removing the object of unsaved document ${id} failed:`, cleanup instanceof Error ? cleanup.message : cleanup),
    );
    throw err;
  }
  return { id };
}

/** The patient's documents, newest first, and the clinic's time zone to show them in. Looking is recorded. */
export async function listDocuments({
  actor, patientId, client,
}: { actor: Actor; patientId?: string; client: ClientInfo }): Promise<{ documents: DocumentView[]; timeZone: string }> {
  const patient = await patientFor(actor, patientId);
  const clinic = await Clinic.findByPk(patient.clinicId, { attributes: ["timeZone"] });
  const rows = await PatientDocument.findAll({
    where: { patientId: patient.id, clinicId: patient.clinicId },
    include: [{ model: User, as: "uploadedBy", attributes: ["id", "name", "email"] }],
    order: [["createdAt", "DESC"]],
  });
  await recordAudit({
    clinicId: patient.clinicId, actorUserId: actor.id, action: "documents.listed", subjectType: "patient", subjectId: patient.id,
    ip: client.ip, userAgent: client.userAgent, data: { count: rows.length },
  });
  const documents = rows.map((d) => ({
    id: d.id,
    kind: d.kind,
    kindLabel: DOCUMENT_KIND_LABEL[d.kind],
    title: d.title,
    contentType: d.contentType,
    byteSize: d.byteSize,
    uploadedBy: {
      name: d.uploadedBy?.name ?? (d.uploadedBy ? d.uploadedBy.email : "A former account"),
      role: d.uploaderRole,
      isYou: d.uploadedById === actor.id,
    },
    createdAt: d.createdAt.toISOString(),
  }));
  return { documents, timeZone: clinic?.timeZone ?? "UTC" };
}

/** Opens one document for viewing or download after checking access; the view is recorded first. */
export async function openDocument({
  actor, documentId, download, client,
}: { actor: Actor; documentId: string; download: boolean; client: ClientInfo }) {
  if (!isUuid(documentId)) throw notFound("That document");
  const doc = await PatientDocument.findByPk(documentId, { include: [{ model: Patient, as: "patient", attributes: ["id", "userId"] }] });
  const allowed =
    !!doc && (actor.role === "patient" ? doc.patient?.userId === actor.id : !!actor.clinicId && doc.clinicId === actor.clinicId);
  if (!doc || !allowed) throw notFound("That document");

  const object = await getObjectStream(doc.objectKey);
  if (!object) {
    console.error(`Document ${doc.id} has no object in storage.`);
    throw new AppError(404, "The file of that document is missing. Please ask the clinic to upload it again.", { code: "not_found" });
  }
  try {
    await recordAudit({
      clinicId: doc.clinicId, actorUserId: actor.id, action: download ? "document.downloaded" : "document.viewed",
      subjectType: "document", subjectId: doc.id, ip: client.ip, userAgent: client.userAgent, data: { patientId: doc.patientId },
    });
  } catch (err) {
    // No record of the view, no bytes: release the storage connection and fail.
    await object.body.cancel().catch(() => undefined);
    throw err;
  }
  return {
    body: object.body,
    length: object.length ?? doc.byteSize,
    contentType: doc.contentType,
    fileName: downloadName(doc.title, doc.contentType),
  };
}
