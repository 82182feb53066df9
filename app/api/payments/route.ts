import { NextResponse } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { listPayments, paymentsCsv } from "@/lib/data/payments";
import { paymentsQuerySchema } from "@/lib/domain/payment-schemas";
import { parseQuery, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The clinic's deposits for staff: `?status=&from=&to=`, `&format=csv` for a spreadsheet. */
export const GET = route(async (req) => {
  const user = await requireUser(STAFF_ROLES);
  const q = parseQuery(req, paymentsQuerySchema);
  const list = await listPayments({ user, status: q.status, from: q.from, to: q.to });
  if (q.format === "csv") {
    return new Response(paymentsCsv(list.rows), {
      headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="deposits${q.from ? `-from-${q.from}` : ""}${q.to ? `-to-${q.to}` : ""}.csv"`, "cache-control": "no-store" },
    });
  }
  return NextResponse.json({
    currency: list.currency,
    totals: list.totals,
    payments: list.rows.map((r) => ({ ...r, visitStartsAt: new Date(r.visitStartsAt).toISOString(), paidAt: r.paidAt ? new Date(r.paidAt).toISOString() : null, refundedAt: r.refundedAt ? new Date(r.refundedAt).toISOString() : null, createdAt: new Date(r.createdAt).toISOString() })),
  });
});
