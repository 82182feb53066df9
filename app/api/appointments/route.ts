import { NextResponse } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { bookVisit } from "@/lib/booking/book";
import { bookingSchema } from "@/lib/booking/schemas";
import { getVisitMoney } from "@/lib/data/payments";
import { listVisits } from "@/lib/data/visits";
import { clientInfo, parseQuery, readJson, route } from "@/lib/server/api";
import { appointmentListQuery } from "@/lib/server/route-schemas";

export const dynamic = "force-dynamic";

/** Books a visit for a proposal: the proposal's patient, or reception on their behalf. */
export const POST = route(async (req) => {
  const user = await requireUser(["patient", "reception", "admin"]);
  const input = await readJson(req, bookingSchema);
  const visit = await bookVisit({ ...input, actor: { user, ...clientInfo(req) } });
  const { deposit } = (await getVisitMoney({ user }, visit.id)).money;
  // The deposit is listed where one applies (the clinic asks one and the share is above zero).
  return NextResponse.json({ id: visit.id, status: visit.status, ...(deposit.status !== "none" ? { deposit: { amountCents: deposit.amountCents, currency: deposit.currency, status: deposit.status } } : {}) }, { status: 201 });
});

/** The clinic's visits for staff, optionally by status. */
export const GET = route(async (req) => {
  const user = await requireUser(STAFF_ROLES);
  const { status } = parseQuery(req, appointmentListQuery);
  const visits = await listVisits({ user, statuses: status ? [status] : undefined });
  return NextResponse.json({ appointments: visits.map((v) => ({ ...v, tooth: v.tooth.fdi, start: v.start.toISOString(), end: v.end.toISOString() })) });
});
