import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { findSlotsToMove } from "@/lib/data/visits";
import { isoInZone } from "@/lib/domain/time-zone";
import { idParams, parseQuery, route } from "@/lib/server/api";
import { visitAvailabilityQuery } from "@/lib/server/route-schemas";

export const dynamic = "force-dynamic";

/** Free start times to move a visit to (its own current reservations do not count as busy). */
export const GET = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["patient", "reception", "admin"]);
  const { id } = await idParams(params, "id");
  const q = parseQuery(req, visitAvailabilityQuery);
  const { timezone, slots } = await findSlotsToMove({ user, id, from: q.from, days: q.days });
  return NextResponse.json({ timezone, slots: slots.map((s) => ({ start: isoInZone(s.start, timezone), end: isoInZone(s.end, timezone) })) });
});
