import { NextResponse, type NextRequest } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { listConsents, signConsent } from "@/lib/data/consents";
import { signConsentSchema } from "@/lib/domain/consent-schemas";
import { clientInfo, parseQuery, readJson, route } from "@/lib/server/api";
import { consentListQuery } from "@/lib/server/route-schemas";

export const dynamic = "force-dynamic";

// A drawn signature is at most 200 kB of PNG (about 270 kB as base64) plus the answers.
const MAX_BODY = 400_000;

/** The clinic's consents a page at a time, newest first, optionally by status (staff). */
export const GET = route(async (req: NextRequest) => {
  const user = await requireUser(STAFF_ROLES);
  const { status, limit, cursor } = parseQuery(req, consentListQuery);
  const { consents, nextCursor } = await listConsents({ user, status, limit, cursor });
  return NextResponse.json({ consents, nextCursor });
});

/** The patient signs their visit's consent. */
export const POST = route(async (req: NextRequest) => {
  const user = await requireUser(["patient"]);
  const input = await readJson(req, signConsentSchema, {
    limit: MAX_BODY,
    tooLargeMessage: "That signature is too large to send. Clear the box and sign again.",
    tooLargeField: "signature",
  });
  const signed = await signConsent({ user, input, ...clientInfo(req) });
  return NextResponse.json({ id: signed.consentId, status: signed.status, signedAt: signed.signedAt.toISOString() }, { status: 201 });
});
