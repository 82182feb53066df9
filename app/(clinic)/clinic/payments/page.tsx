import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { listPayments } from "@/lib/data/payments";
import { DEPOSIT_WORDS } from "@/lib/domain/money";
import { paymentsQuerySchema } from "@/lib/domain/payment-schemas";
import { money, when } from "@/lib/format";

export const metadata: Metadata = { title: "Payments" };

const STATUSES = ["due", "paid", "refunded", "waived", "released"] as const;

export default async function PaymentsPage({ searchParams }: { searchParams: Promise<Record<string, string>> }) {
  const user = await requirePageUser(STAFF_ROLES);
  const parsed = paymentsQuerySchema.safeParse(await searchParams);
  const q = parsed.success ? parsed.data : {};
  const { rows, totals, currency, timeZone } = await listPayments({ user, status: q.status, from: q.from, to: q.to });
  const csv = new URLSearchParams({ ...(q.status ? { status: q.status } : {}), ...(q.from ? { from: q.from } : {}), ...(q.to ? { to: q.to } : {}), format: "csv" });
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-bold">Deposits</h1>
      <form className="card flex flex-wrap items-end gap-3" method="get">
        <div>
          <label htmlFor="status" className="field-label">Status</label>
          <select id="status" name="status" className="field-input" defaultValue={q.status ?? ""}>
            <option value="">All</option>
            {STATUSES.map((s) => <option key={s} value={s}>{DEPOSIT_WORDS[s]}</option>)}
          </select>
        </div>
        <div><label htmlFor="from" className="field-label">Booked from</label><input id="from" name="from" type="date" className="field-input" defaultValue={q.from} /></div>
        <div><label htmlFor="to" className="field-label">to</label><input id="to" name="to" type="date" className="field-input" defaultValue={q.to} /></div>
        <button type="submit" className="btn-quiet">Show</button>
        <a className="btn-quiet" href={`/api/payments?${csv}`} download>Export CSV</a>
      </form>
      {!parsed.success ? <p role="alert" className="text-clay-700">{parsed.error.issues[0]?.message}</p> : null}
      <p className="text-sm" data-testid="payment-totals">
        {STATUSES.filter((s) => totals[s]).map((s) => `${DEPOSIT_WORDS[s]}: ${money(totals[s], currency)}`).join(" · ") || "No deposits match."}
      </p>
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm">
          <thead><tr className="border-b border-line"><th className="p-2">Booked</th><th className="p-2">Patient</th><th className="p-2">Visit</th><th className="p-2">Amount</th><th className="p-2">Status</th><th className="p-2">Paid</th></tr></thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.depositId} className="border-b border-line">
                <td className="p-2">{when(r.createdAt, timeZone)}</td>
                <td className="p-2"><Link href={`/clinic/visits/${r.appointmentId}`}>{r.patientName ?? "Patient"}</Link></td>
                <td className="p-2">{when(r.visitStartsAt, timeZone)}</td>
                <td className="p-2">{money(r.amountCents, r.currency)}</td>
                <td className="p-2">{DEPOSIT_WORDS[r.status]}</td>
                <td className="p-2">{r.paidAt ? when(r.paidAt, timeZone) : "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
