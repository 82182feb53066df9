import { type NextRequest } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { consentPdfFor } from "@/lib/data/consents";
import { idParams, parseQuery, route } from "@/lib/server/api";
import { consentPdfQuery } from "@/lib/server/route-schemas";

export const dynamic = "force-dynamic";

/** The sealed PDF (latest version, or `?version=n`) for its patient and the clinic's staff. */
export const GET = route<{ params: Promise<{ id: string }> }>(async (req: NextRequest, { params }) => {
  const user = await requireUser(["patient", "dentist", "reception", "admin"]);
  const { id } = await idParams(params, "id");
  const { version } = parseQuery(req, consentPdfQuery);
  const { pdf, filename } = await consentPdfFor({ user, consentId: id, version });
  return new Response(new Uint8Array(pdf), {
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `inline; filename="${filename}"`,
      "Cache-Control": "private, no-store",
    },
  });
});
