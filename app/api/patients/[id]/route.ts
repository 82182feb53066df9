import { NextResponse, type NextRequest } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { getPatientDetails, patientSchemaContext, updatePatient } from "@/lib/data/patients";
import { updatePatientSchema } from "@/lib/domain/patient-record";
import { clientInfo, readJson, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ id: string }> };

/** One patient of the caller's clinic (any other id is a 404). */
export const GET = route<Ctx>(async (_req: NextRequest, { params }) => {
  const user = await requireUser(STAFF_ROLES);
  const { id } = await params;
  return NextResponse.json({ patient: await getPatientDetails({ user, patientId: id }) });
});

/** Correct details; `archived: true|false` archives or unarchives. */
export const PATCH = route<Ctx>(async (req: NextRequest, { params }) => {
  const user = await requireUser(STAFF_ROLES);
  const { id } = await params;
  // The row is looked up first, so another clinic's id is a 404 even with a bad body.
  await getPatientDetails({ user, patientId: id });
  const changes = await readJson(req, updatePatientSchema(await patientSchemaContext({ clinicId: user.clinicId! })));
  await updatePatient({ user, patientId: id, changes, info: clientInfo(req) });
  return NextResponse.json({ patient: await getPatientDetails({ user, patientId: id }) });
});
