import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { moveSchema } from "@/lib/booking/schemas";
import { moveVisit } from "@/lib/booking/transitions";
import { clientInfo, readJson, idParams, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

export const POST = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["patient", "reception", "admin"]);
  const { id } = await idParams(params, "id");
  const { start } = await readJson(req, moveSchema);
  const visit = await moveVisit({ user, ...clientInfo(req) }, id, start);
  return NextResponse.json({ id: visit.id, status: visit.status, start: visit.startsAt.toISOString() });
});
