"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { DESK_METHOD_WORDS, DESK_METHODS } from "@/lib/domain/payment-schemas";

/** Reception's money actions on a visit: waive a due deposit, record a payment taken at the desk. */
export function DeskActions({ visitId, canWaive, suggestedAmount }: { visitId: string; canWaive: boolean; suggestedAmount: string }) {
  const router = useRouter();
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function send(path: string, body: Record<string, unknown>, done: string) {
    setBusy(true);
    setMessage(null);
    const res = await fetch(`/api/appointments/${visitId}/${path}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
    const json = await res.json().catch(() => ({}));
    setBusy(false);
    setMessage(res.ok ? { ok: true, text: done } : { ok: false, text: json.error ?? "That did not work. Please try again." });
    if (res.ok) router.refresh();
  }

  return (
    <div className="space-y-4">
      {message ? <p role={message.ok ? "status" : "alert"} className={`rounded-lg p-3 text-sm font-medium ${message.ok ? "bg-sage-50 text-sage-700" : "bg-clay-50 text-clay-700"}`}>{message.text}</p> : null}
      {canWaive ? (
        <form className="space-y-2" onSubmit={(e) => { e.preventDefault(); const f = new FormData(e.currentTarget); void send("deposit/waive", { reason: f.get("reason") }, "The deposit is waived."); }}>
          <label htmlFor="waive-reason" className="field-label">Waive the deposit: reason</label>
          <input id="waive-reason" name="reason" className="field-input" required minLength={3} maxLength={300} />
          <button type="submit" className="btn-quiet" disabled={busy}>Waive the deposit</button>
        </form>
      ) : null}
      <form className="grid gap-2 sm:grid-cols-3" onSubmit={(e) => { e.preventDefault(); const f = new FormData(e.currentTarget); void send("desk-payments", Object.fromEntries(f), "The payment is recorded."); }}>
        <p className="field-label sm:col-span-3">Record a payment taken at the desk</p>
        <div>
          <label htmlFor="desk-method" className="text-sm">Method</label>
          <select id="desk-method" name="method" className="field-input" defaultValue="debit">
            {DESK_METHODS.map((m) => <option key={m} value={m}>{DESK_METHOD_WORDS[m]}</option>)}
          </select>
        </div>
        <div>
          <label htmlFor="desk-amount" className="text-sm">Amount</label>
          <input id="desk-amount" name="amount" className="field-input" inputMode="decimal" defaultValue={suggestedAmount} required />
        </div>
        <div>
          <label htmlFor="desk-reference" className="text-sm">Reference (optional)</label>
          <input id="desk-reference" name="reference" className="field-input" maxLength={80} />
        </div>
        <button type="submit" className="btn-quiet sm:col-span-3" disabled={busy}>Record the payment</button>
      </form>
    </div>
  );
}
