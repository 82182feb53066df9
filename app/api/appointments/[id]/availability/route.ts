import { NextResponse } from "next/server";
import { z } from "zod";
import { requireUser } from "@/lib/auth/session";
import { findSlotsToMove } from "@/lib/data/visits";
import { isoInZone } from "@/lib/domain/time-zone";
import { route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

const query = z.object({
  from: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, { message: "from must be a date like 2027-03-15." }).optional(),
  days: z.coerce.number<number>().int().min(1, { message: "days must be at least 1." }).max(60, { message: "days can be at most 60." }).optional(),
});

/** Free start times to move a visit to (its own current reservations do not count as busy). */
export const GET = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["patient", "reception", "admin"]);
  const { id } = await params;
  const q = query.parse(Object.fromEntries(req.nextUrl.searchParams));
  const { timezone, slots } = await findSlotsToMove({ user, id, from: q.from, days: q.days });
  return NextResponse.json({ timezone, slots: slots.map((s) => ({ start: isoInZone(s.start, timezone), end: isoInZone(s.end, timezone) })) });
});
