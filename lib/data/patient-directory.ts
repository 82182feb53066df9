// Data access for staff looking up the patients of their own clinic.
import "server-only";
import { Patient, User } from "@/db/models";
import { isUuid } from "@/lib/domain/documents";
import { notFound } from "@/lib/server/errors";

export type PatientSummary = { id: string; name: string; email: string; dateOfBirth: string | null; phone: string | null; language: "en" | "fr" };

function summary(p: Patient): PatientSummary {
  return { id: p.id, name: p.user?.name ?? p.user?.email ?? "Unnamed patient", email: p.user?.email ?? "", dateOfBirth: p.dateOfBirth, phone: p.phone, language: p.language };
}

export async function listClinicPatients({ clinicId }: { clinicId: string }): Promise<PatientSummary[]> {
  const rows = await Patient.findAll({
    where: { clinicId },
    include: [{ model: User, as: "user", attributes: ["name", "email"] }],
    order: [[{ model: User, as: "user" }, "name", "ASC"]],
  });
  return rows.map(summary);
}

/** One patient of the clinic; any other id (malformed, unknown, another clinic's) is a 404. */
export async function findClinicPatient({ clinicId, patientId }: { clinicId: string; patientId: string }): Promise<PatientSummary> {
  if (!isUuid(patientId)) throw notFound("That patient");
  const row = await Patient.findOne({ where: { id: patientId, clinicId }, include: [{ model: User, as: "user", attributes: ["name", "email"] }] });
  if (!row) throw notFound("That patient");
  return summary(row);
}
