import { NextResponse, type NextRequest } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { verifyConsentPdf } from "@/lib/data/consents";
import { readForm, route } from "@/lib/server/api";
import { AppError, badRequest } from "@/lib/server/errors";

export const dynamic = "force-dynamic";

const MAX_PDF = 20 * 1024 * 1024;

/** Staff upload a PDF (multipart `file`) and learn whether it is an unaltered consent of this clinic. */
export const POST = route(async (req: NextRequest) => {
  const user = await requireUser(STAFF_ROLES);
  const form = await readForm(req, MAX_PDF + 64 * 1024, { tooLargeMessage: "That file is too large to be a consent PDF.", field: "file" });
  const file = form.get("file");
  if (!(file instanceof Blob) || file.size === 0) throw badRequest("Choose a PDF file to check.", "file");
  if (file.size > MAX_PDF) throw new AppError(413, "That file is too large to be a consent PDF.", { field: "file" });
  const result = await verifyConsentPdf({ user, bytes: new Uint8Array(await file.arrayBuffer()) });
  return NextResponse.json(result.match ? { match: true, consentId: result.consentId } : { match: false });
}, { body: "multipart" });
