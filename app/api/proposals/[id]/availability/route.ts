import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { availabilityQuerySchema } from "@/lib/booking/schemas";
import { searchSlots } from "@/lib/booking/search";
import { allowedOption, getBookableProposal } from "@/lib/data/proposals";
import { isoInZone } from "@/lib/domain/time-zone";
import { idParams, parseQuery, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

export const GET = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["patient", "reception", "dentist", "admin"]);
  const { id } = await idParams(params, "id");
  const query = parseQuery(req, availabilityQuerySchema);
  const row = await getBookableProposal({ user, id });
  allowedOption(row, query.materialId, query.mode);
  const { timezone, slots, totalMinutes } = await searchSlots({ proposal: row, materialId: query.materialId, mode: query.mode, from: query.from, days: query.days });
  return NextResponse.json({
    timezone,
    durationMinutes: totalMinutes,
    slots: slots.map((s) => ({ start: isoInZone(s.start, timezone), end: isoInZone(s.end, timezone) })),
  });
});
