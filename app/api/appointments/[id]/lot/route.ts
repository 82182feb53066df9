import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { lotBodySchema, recordLot } from "@/lib/data/lots";
import { clientInfo, readJson, idParams, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** Records the crown block used on a visit: `{ elementString }` (GS1 code) or `{ lot }` (typed). */
export const POST = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["dentist", "reception"]);
  const { id } = await idParams(params, "id");
  const body = await readJson(req, lotBodySchema);
  const recorded = await recordLot({ user, appointmentId: id, body, ...clientInfo(req) });
  return NextResponse.json(recorded);
});
