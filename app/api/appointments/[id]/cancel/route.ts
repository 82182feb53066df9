import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { cancelSchema } from "@/lib/booking/schemas";
import { cancelVisit } from "@/lib/booking/transitions";
import { clientInfo, readJson, idParams, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

export const POST = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["patient", "reception", "admin"]);
  const { id } = await idParams(params, "id");
  const { reason } = await readJson(req, cancelSchema);
  const visit = await cancelVisit({ user, ...clientInfo(req) }, id, reason);
  return NextResponse.json({ id: visit.id, status: visit.status });
});
