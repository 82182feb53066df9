import { NextResponse, type NextRequest } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { patientSchemaContext, registerPatient, searchPatients, SORTS, type PatientSort } from "@/lib/data/patients";
import { registerPatientSchema } from "@/lib/domain/patient-record";
import { clientInfo, readJson, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** Register a patient of the caller's clinic. 409 with `existingId` when the same person is on file. */
export const POST = route(async (req: NextRequest) => {
  const user = await requireUser(STAFF_ROLES);
  const input = await readJson(req, registerPatientSchema(await patientSchemaContext({ clinicId: user.clinicId! })));
  const { id } = await registerPatient({ user, input, info: clientInfo(req) });
  return NextResponse.json({ id }, { status: 201 });
});

/** Search the clinic's patients: `q` (name, e-mail, phone digits or YYYY-MM-DD), `page`, `archived=1`, `sort`. */
export const GET = route(async (req: NextRequest) => {
  const user = await requireUser(STAFF_ROLES);
  const p = req.nextUrl.searchParams;
  const sort = (SORTS as readonly string[]).includes(p.get("sort") ?? "") ? (p.get("sort") as PatientSort) : "name";
  const archived = ["1", "true"].includes(p.get("archived") ?? "");
  const result = await searchPatients({ user, q: p.get("q") ?? "", page: Number(p.get("page") ?? 1), archived, sort });
  return NextResponse.json(result);
});
