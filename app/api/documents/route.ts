import { NextResponse, type NextRequest } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { createDocument, listDocuments } from "@/lib/data/documents";
import { formText, readUploadForm, uploadedFile } from "@/lib/documents/read-upload";
import { documentFieldsSchema } from "@/lib/documents/schema";
import { clientInfo, parseQuery, route } from "@/lib/server/api";
import { documentListQuery } from "@/lib/server/route-schemas";

export const dynamic = "force-dynamic";

/** Upload a document: the patient for themself, staff for a patient of their clinic (`patientId`). */
export const POST = route(async (req: NextRequest) => {
  const user = await requireUser();
  const form = await readUploadForm(req);
  const file = await uploadedFile(form);
  const fields = documentFieldsSchema.parse({
    kind: formText(form, "kind"),
    title: formText(form, "title"),
    patientId: formText(form, "patientId"),
  });
  const { id } = await createDocument({ actor: user, ...fields, file, client: clientInfo(req) });
  return NextResponse.json({ id }, { status: 201 });
}, { body: "multipart" });

/** The caller's documents (patient), or one patient's documents (staff, `?patientId=`). */
export const GET = route(async (req: NextRequest) => {
  const user = await requireUser();
  const { patientId } = parseQuery(req, documentListQuery);
  const { documents } = await listDocuments({ actor: user, patientId, client: clientInfo(req) });
  return NextResponse.json({ documents });
});
