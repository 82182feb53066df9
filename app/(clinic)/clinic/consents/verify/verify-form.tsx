"use client";

import { useState } from "react";

type Result = { match: true; consentId: string } | { match: false };

export function VerifyForm() {
  const [file, setFile] = useState<File | null>(null);
  const [result, setResult] = useState<Result | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function check(e: React.FormEvent) {
    e.preventDefault();
    setResult(null);
    setError(null);
    if (!file) {
      setError("Choose a PDF file to check.");
      return;
    }
    setBusy(true);
    const form = new FormData();
    form.set("file", file);
    const res = await fetch("/api/consents/verify", { method: "POST", body: form });
    const body = await res.json().catch(() => ({}));
    setBusy(false);
    if (res.ok) setResult(body as Result);
    else setError(body.error ?? "The check did not work. Please try again.");
  }

  return (
    <form onSubmit={check} noValidate className="card space-y-4">
      <div>
        <label htmlFor="verify-file" className="field-label">Consent PDF</label>
        <input id="verify-file" type="file" accept="application/pdf,.pdf" className="field-input"
          aria-describedby={error ? "verify-error" : undefined}
          onChange={(e) => { setFile(e.target.files?.[0] ?? null); setResult(null); setError(null); }} />
        {error ? <p id="verify-error" className="field-error" role="alert">{error}</p> : null}
      </div>
      <button type="submit" className="btn-primary" disabled={busy}>{busy ? "Checking…" : "Check"}</button>
      <div aria-live="polite" data-testid="verify-result">
        {result?.match ? (
          <p className="rounded-lg border-l-4 border-sage-600 bg-sage-50 p-3 font-medium text-sage-700">
            Matches: this is an unaltered consent issued by this clinic.{" "}
            <a className="underline" href={`/api/consents/${result.consentId}/pdf`}>Open the stored copy</a> (consent {result.consentId}).
          </p>
        ) : result ? (
          <p className="rounded-lg border-l-4 border-clay-600 bg-clay-50 p-3 font-medium text-clay-700">
            Does not match: this file is not a consent this clinic issued, or it was changed after sealing.
          </p>
        ) : null}
      </div>
    </form>
  );
}
