import type { Metadata } from "next";
import { requirePageUser } from "@/lib/auth/session";
import { listPriceList } from "@/lib/data/payments";
import { UNPAID_HOLD_MINUTES } from "@/lib/domain/money";
import { saveDepositPolicyAction, savePricesAction } from "./actions";

export const metadata: Metadata = { title: "Prices and deposit" };

export default async function PaymentSettingsPage({ searchParams }: { searchParams: Promise<{ saved?: string; error?: string }> }) {
  const user = await requirePageUser(["admin"]);
  const { clinic, materials } = await listPriceList(user);
  const { saved, error } = await searchParams;
  const cur = clinic.currency;
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Prices and deposit</h1>
      {saved ? <p role="status" className="rounded-lg bg-sage-50 p-3 text-sm font-medium text-sage-700">{saved}</p> : null}
      {error ? <p role="alert" className="rounded-lg bg-clay-50 p-3 text-sm font-medium text-clay-700">{error}</p> : null}
      <section className="card space-y-3" aria-labelledby="prices">
        <h2 id="prices" className="text-lg font-semibold">List price of a crown, by material ({cur})</h2>
        <p className="text-sm text-ink-soft">A new proposal starts from these prices; the dentist may change them for one patient. Leave a price empty to use the proposal&apos;s single fee.</p>
        <form action={savePricesAction} className="space-y-2">
          {materials.map((m) => (
            <div key={m.id} className="grid items-center gap-2 sm:grid-cols-[16rem_10rem]">
              <label htmlFor={`fee-${m.id}`}>{m.name}</label>
              <input id={`fee-${m.id}`} name={`fee:${m.id}`} inputMode="decimal" className="field-input" defaultValue={m.listFeeCents == null ? "" : (m.listFeeCents / 100).toFixed(2)} />
            </div>
          ))}
          <button type="submit" className="btn-primary">Save prices</button>
        </form>
      </section>
      <section className="card space-y-3" aria-labelledby="deposit">
        <h2 id="deposit" className="text-lg font-semibold">Deposit when a visit is booked</h2>
        <p className="text-sm text-ink-soft">Paid online after booking. An unpaid booking holds its time for {UNPAID_HOLD_MINUTES} minutes. The deposit is refunded in full when the clinic declines or cancels, and when the patient cancels before the cut-off below; after it, the clinic keeps it. Local rules on deposits and refunds prevail.</p>
        <form action={saveDepositPolicyAction} className="grid gap-3 sm:grid-cols-2">
          <fieldset className="sm:col-span-2">
            <legend className="field-label">Policy</legend>
            {([["none", "No deposit"], ["fixed", "A fixed amount"], ["percent", "A percentage of the patient's share"]] as const).map(([v, label]) => (
              <label key={v} className="mr-4 inline-flex min-h-10 items-center gap-2"><input type="radio" name="kind" value={v} defaultChecked={clinic.depositKind === v} className="size-5 accent-harbour-600" />{label}</label>
            ))}
          </fieldset>
          <div><label htmlFor="fixedAmount" className="field-label">Fixed amount ({cur})</label><input id="fixedAmount" name="fixedAmount" inputMode="decimal" className="field-input" defaultValue={clinic.depositKind === "fixed" ? (clinic.depositValue / 100).toFixed(2) : ""} /></div>
          <div><label htmlFor="percent" className="field-label">Percentage (%)</label><input id="percent" name="percent" inputMode="numeric" className="field-input" defaultValue={clinic.depositKind === "percent" ? String(clinic.depositValue) : ""} /></div>
          <div><label htmlFor="refundHours" className="field-label">Refundable until (hours before the visit)</label><input id="refundHours" name="refundHours" inputMode="numeric" className="field-input" defaultValue={String(clinic.depositRefundHours)} /></div>
          <div className="sm:col-span-2"><button type="submit" className="btn-primary">Save the deposit policy</button></div>
        </form>
      </section>
    </div>
  );
}
