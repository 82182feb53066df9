import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { withdrawConsent } from "@/lib/data/consents";
import { withdrawConsentSchema } from "@/lib/domain/consent-schemas";
import { clientInfo, idParams, readJson, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** Withdraws a signed consent before the visit: the patient, or staff when the patient tells the clinic. */
export const POST = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["patient", "reception", "dentist", "admin"]);
  const { id } = await idParams(params, "id");
  // The body (a reason) is optional: an empty body is fine, anything else must be valid JSON.
  const { reason } = await readJson(req, withdrawConsentSchema);
  const withdrawn = await withdrawConsent({ user, consentId: id, reason, ...clientInfo(req) });
  return NextResponse.json({ id: withdrawn.id, status: withdrawn.status, withdrawnAt: withdrawn.withdrawnAt.toISOString() });
});
