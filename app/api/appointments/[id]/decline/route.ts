import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { declineSchema } from "@/lib/booking/schemas";
import { declineVisit } from "@/lib/booking/transitions";
import { clientInfo, readJson, idParams, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

export const POST = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["reception", "admin"]);
  const { id } = await idParams(params, "id");
  const { reason } = await readJson(req, declineSchema);
  const visit = await declineVisit({ user, ...clientInfo(req) }, id, reason);
  return NextResponse.json({ id: visit.id, status: visit.status });
});
