import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { getVisitTimeline } from "@/lib/data/visits";
import { idParams, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

export const GET = route<{ params: Promise<{ id: string }> }>(async (_req, { params }) => {
  const user = await requireUser();
  const { id } = await idParams(params, "id");
  return NextResponse.json(await getVisitTimeline({ user, id }));
});
