import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { reviewConsent } from "@/lib/data/consents";
import { clientInfo, idParams, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The dentist marks a signed consent as reviewed (their own attestation). */
export const POST = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["dentist"]);
  const { id } = await idParams(params, "id");
  const reviewed = await reviewConsent({ user, consentId: id, ...clientInfo(req) });
  return NextResponse.json({ id: reviewed.id, status: reviewed.status, reviewedAt: reviewed.reviewedAt.toISOString(), pdfVersion: reviewed.pdfVersion });
});
