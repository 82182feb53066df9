import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { withdrawConsent } from "@/lib/data/consents";
import { withdrawConsentSchema } from "@/lib/domain/consent-schemas";
import { clientInfo, route } from "@/lib/server/api";
import { badRequest } from "@/lib/server/errors";

export const dynamic = "force-dynamic";

/** Withdraws a signed consent before the visit: the patient, or staff when the patient tells the clinic. */
export const POST = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["patient", "reception", "dentist", "admin"]);
  const { id } = await params;
  // The body (a reason) is optional: an empty body is fine, anything else must be valid JSON.
  const text = await req.text();
  let body: unknown = {};
  if (text.trim()) {
    try {
      body = JSON.parse(text);
    } catch {
      throw badRequest("The request body must be valid JSON.");
    }
  }
  const { reason } = withdrawConsentSchema.parse(body);
  const withdrawn = await withdrawConsent({ user, consentId: id, reason, ...clientInfo(req) });
  return NextResponse.json({ id: withdrawn.id, status: withdrawn.status, withdrawnAt: withdrawn.withdrawnAt.toISOString() });
});
