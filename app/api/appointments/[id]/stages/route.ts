import { NextResponse } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { loadVisitProgress } from "@/lib/data/progress";
import { idParams, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** A visit's stages as planned, recorded and projected, with the day board's conflicts that concern it (staff). */
export const GET = route<{ params: Promise<{ id: string }> }>(async (_req, { params }) => {
  const user = await requireUser(STAFF_ROLES);
  const { id } = await idParams(params, "id");
  return NextResponse.json(await loadVisitProgress({ user, appointmentId: id }));
});
