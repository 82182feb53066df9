// The money part of a visit page: fee, dental-plan estimate, deposit and balance. Shared by the
// patient's and the clinic's visit pages; the actions differ by who is looking.
import type { ReactNode } from "react";
import type { getVisitMoney } from "@/lib/data/payments";
import { DEPOSIT_WORDS, UNPAID_HOLD_MINUTES } from "@/lib/domain/money";
import { money, when } from "@/lib/format";

type Money = Awaited<ReturnType<typeof getVisitMoney>>["money"];

export const PLAN_CAUTION = "This is an estimate from the figures entered here, not your dental plan's decision. The plan's own decision prevails; ask your plan for a pre-authorisation if you need certainty.";

export function VisitMoney({ m, zone, children, returned }: { m: Money; zone: string; children?: ReactNode; returned?: boolean }) {
  const d = m.deposit;
  return (
    <section className="card space-y-3" aria-labelledby="money" data-testid="visit-money">
      <h2 id="money" className="text-lg font-semibold">Fee and deposit</h2>
      <dl className="grid grid-cols-[10rem_1fr] gap-y-1 text-sm">
        <dt className="text-ink-muted">Fee</dt><dd>{money(m.feeCents, m.currency)}</dd>
        {m.planShareEstimateCents !== null ? (
          <>
            <dt className="text-ink-muted">Plan share (estimate)</dt><dd>{money(m.planShareEstimateCents, m.currency)}</dd>
            <dt className="text-ink-muted">Your share (estimate)</dt><dd>{money(m.patientShareCents, m.currency)}</dd>
          </>
        ) : null}
        <dt className="text-ink-muted">Deposit</dt>
        <dd data-testid="deposit-status">{d.status === "none" ? DEPOSIT_WORDS.none : `${DEPOSIT_WORDS[d.status]} · ${money(d.amountCents, d.currency)}`}{d.paidAt ? ` · ${when(d.paidAt, zone)}` : ""}</dd>
        {m.deskPayments.map((p) => (
          <div key={p.id} className="contents"><dt className="text-ink-muted">Paid at the desk</dt><dd>{money(p.amountCents, p.currency)} · {p.method}{p.reference ? ` · ${p.reference}` : ""}</dd></div>
        ))}
        <dt className="font-semibold">Balance due{m.planShareEstimateCents !== null ? " (estimate)" : ""}</dt><dd className="font-semibold" data-testid="balance-due">{money(m.balanceDueCents, m.currency)}</dd>
      </dl>
      {d.status === "due" && returned ? (
        <p role="status" className="rounded-lg bg-harbour-50 p-3 text-sm">We are waiting for the payment service to confirm your payment. This page shows it as paid within a minute; reload it if it does not.</p>
      ) : null}
      {d.status === "due" ? (
        <p className="text-sm">The clinic asks a deposit of {money(d.amountCents, d.currency)} to hold the chair, the mill and the furnace for your visit. If it is not paid within {UNPAID_HOLD_MINUTES} minutes of booking, the time is released and offered to others.</p>
      ) : null}
      {children}
      {m.planShareEstimateCents !== null ? <p className="text-xs text-ink-soft">{PLAN_CAUTION}</p> : null}
    </section>
  );
}
