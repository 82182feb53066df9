import { NextResponse } from "next/server";
import { z } from "zod";
import { Proposal } from "@/db/models";
import { requireUser } from "@/lib/auth/session";
import { searchSlots } from "@/lib/booking/search";
import { findVisitFor } from "@/lib/booking/transitions";
import { calendarDateSchema } from "@/lib/domain/input";
import { isoInZone } from "@/lib/domain/time-zone";
import { idParams, parseQuery, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

const query = z.object({
  from: calendarDateSchema("from").optional(),
  days: z.coerce.number<number>().int().min(1, { message: "days must be at least 1." }).max(60, { message: "days can be at most 60." }).optional(),
});

/** Free start times to move a visit to (its own current reservations do not count as busy). */
export const GET = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["patient", "reception", "admin"]);
  const { id } = await idParams(params, "id");
  const q = parseQuery(req, query);
  const visit = await findVisitFor({ user }, id);
  const proposal = (await Proposal.findByPk(visit.proposalId))!;
  const { timezone, slots } = await searchSlots({ proposal, materialId: visit.materialId, mode: visit.mode, from: q.from, days: q.days, excludeAppointmentId: visit.id });
  return NextResponse.json({ timezone, slots: slots.map((s) => ({ start: isoInZone(s.start, timezone), end: isoInZone(s.end, timezone) })) });
});
