import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { confirmVisit } from "@/lib/booking/transitions";
import { clientInfo, idParams, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

export const POST = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["reception", "admin"]);
  const { id } = await idParams(params, "id");
  const visit = await confirmVisit({ user, ...clientInfo(req) }, id);
  return NextResponse.json({ id: visit.id, status: visit.status });
});
