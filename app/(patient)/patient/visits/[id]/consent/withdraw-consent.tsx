"use client";

import { useTranslations } from "next-intl";
import { useRouter } from "next/navigation";
import { useState } from "react";

/** Withdrawing consent before the visit: asks once more, takes an optional reason. */
export function WithdrawConsent({ consentId }: { consentId: string }) {
  const router = useRouter();
  const t = useTranslations("consent");
  const tc = useTranslations("common");
  const [asking, setAsking] = useState(false);
  const [reason, setReason] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function withdraw() {
    setBusy(true);
    setError(null);
    const res = await fetch(`/api/consents/${consentId}/withdraw`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(reason.trim() ? { reason } : {}),
    });
    setBusy(false);
    if (res.ok) {
      setAsking(false);
      router.refresh();
      return;
    }
    const body = await res.json().catch(() => ({}));
    setError(body.error ?? t("withdrawFailed"));
  }

  return (
    <section className="card space-y-3" aria-labelledby="withdraw-heading">
      <h2 id="withdraw-heading" className="text-lg font-semibold">{t("withdrawHeading")}</h2>
      <p>{t("withdrawIntro")}</p>
      {error ? <p role="alert" className="field-error">{error}</p> : null}
      {asking ? (
        <div className="space-y-3">
          <div>
            <label htmlFor="withdraw-reason" className="field-label">{tc("reason")}</label>
            <textarea id="withdraw-reason" className="field-input" rows={2} maxLength={500} value={reason} onChange={(e) => setReason(e.target.value)} />
          </div>
          <div className="flex flex-wrap gap-2">
            <button type="button" className="btn-danger" onClick={withdraw} disabled={busy}>{busy ? t("withdrawing") : t("withdrawConfirm")}</button>
            <button type="button" className="btn-quiet" onClick={() => setAsking(false)} disabled={busy}>{t("keep")}</button>
          </div>
        </div>
      ) : (
        <button type="button" className="btn-quiet" onClick={() => setAsking(true)}>{t("withdraw")}</button>
      )}
    </section>
  );
}
