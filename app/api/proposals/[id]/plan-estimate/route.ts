import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { savePlanEstimate } from "@/lib/data/payments";
import { z } from "zod";
import { clientInfo, idParams, readJson, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The patient (own proposal) or staff save dental-plan figures; shares are computed on the server. */
export const PUT = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["patient", "reception", "dentist", "admin"]);
  const { id } = await idParams(params, "id");
  // Parsed once, inside savePlanEstimate, with the form's own schema.
  const saved = await savePlanEstimate({ user, ...clientInfo(req) }, id, await readJson(req, z.unknown()));
  return NextResponse.json({ coveragePercent: saved.coveragePercent, deductibleRemainingCents: saved.deductibleRemaining, annualMaxRemainingCents: saved.annualMaxRemaining, preauthReference: saved.preauthReference });
});
