import { NextResponse } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { endOutage } from "@/lib/data/outages";
import { clientInfo, parseSerialId, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** Back in service: removes a range not started yet, or ends a current one now (staff). */
export const DELETE = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(STAFF_ROLES);
  const id = String(parseSerialId((await params).id, "id", "That out-of-service range"));
  return NextResponse.json(await endOutage({ user, outageId: id, ...clientInfo(req) }));
});
