"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

/** The dentist's own attestation, recorded with time, IP and device, and sealed into a new PDF version. */
export function ReviewButton({ consentId }: { consentId: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function review() {
    setBusy(true);
    setError(null);
    const res = await fetch(`/api/consents/${consentId}/review`, { method: "POST" });
    setBusy(false);
    if (res.ok) {
      router.refresh();
      return;
    }
    const body = await res.json().catch(() => ({}));
    setError(body.error ?? "That did not work. Please try again.");
  }

  return (
    <div className="space-y-2">
      <p className="text-sm">
        By marking it reviewed you confirm that you went through this consent and the health answers with the patient, and that
        they understood and agreed.
      </p>
      {error ? <p role="alert" className="field-error">{error}</p> : null}
      <button type="button" className="btn-primary w-full" onClick={review} disabled={busy}>
        {busy ? "Recording…" : "Mark as reviewed"}
      </button>
    </div>
  );
}
