// Data access for the clinic a signed-in person belongs to (its name, time zone, currency, settings).
import "server-only";
import { Clinic } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { notFound } from "@/lib/server/errors";
import { patientOf } from "./access";

/** The user's own clinic: staff through their account, a patient through their patient record. */
export async function clinicOf(user: SessionUser): Promise<Clinic> {
  const clinicId = user.role === "patient" ? (await patientOf(user)).clinicId : user.clinicId;
  const clinic = clinicId ? await Clinic.findByPk(clinicId) : null;
  if (!clinic) throw notFound("Your clinic");
  return clinic;
}
