"use client";

import { useTranslations } from "next-intl";
import { useState } from "react";

/** Opens the payment service's page for the deposit; the server decides the amount. */
export function PayDepositButton({ visitId, label }: { visitId: string; label: string }) {
  const t = useTranslations("payments");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function pay() {
    setBusy(true);
    setError(null);
    const res = await fetch(`/api/appointments/${visitId}/deposit`, { method: "POST" });
    const body = await res.json().catch(() => ({}));
    if (res.ok && typeof body.checkoutUrl === "string") {
      window.location.assign(body.checkoutUrl);
      return;
    }
    setBusy(false);
    setError(body.error ?? t("payFailed"));
  }

  return (
    <div className="space-y-2">
      <button type="button" className="btn-primary w-full" onClick={pay} disabled={busy}>{busy ? t("opening") : label}</button>
      {error ? <p role="alert" className="rounded-lg bg-clay-50 p-3 text-sm font-medium text-clay-700">{error}</p> : null}
    </div>
  );
}
