// Row-level access: may this user see this patient's rows? Someone else's record is a 404.
import "server-only";
import { Patient } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { forbidden, notFound } from "@/lib/server/errors";

/** The patient row of a signed-in patient. */
export async function patientOf(user: SessionUser): Promise<Patient> {
  if (user.role !== "patient") throw forbidden();
  const patient = await Patient.findOne({ where: { userId: user.id } });
  if (!patient) throw notFound("Your patient record");
  return patient;
}

/** Throws 404 unless the row belongs to the user (patient) or to the user's clinic (staff). */
export async function assertCanSee(user: SessionUser, row: { clinicId: string; patientId: string } | null, what = "That record"): Promise<void> {
  if (!row) throw notFound(what);
  if (user.role === "patient") {
    const patient = await Patient.findOne({ where: { userId: user.id } });
    if (!patient || patient.id !== row.patientId) throw notFound(what);
  } else if (row.clinicId !== user.clinicId) {
    throw notFound(what);
  }
}
