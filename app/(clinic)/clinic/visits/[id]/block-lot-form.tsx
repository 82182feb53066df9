"use client";

// Records the crown block used: the package's GS1 code (a scanner types it into the field and
// presses Enter) or the lot typed by hand. The server parses and checks it again.
import { useRouter } from "next/navigation";
import { useState } from "react";

type Recorded = { gtin?: string; lot: string; expiry?: string; serial?: string };

/** Scanners and people may write the group separator visibly; the API wants ASCII 29. */
const withSeparators = (code: string) => code.replace(/<GS>|␝|\\x1d/gi, "\u001d");

export function BlockLotForm({ visitId }: { visitId: string }) {
  const router = useRouter();
  const [mode, setMode] = useState<"code" | "lot">("code");
  const [value, setValue] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [recorded, setRecorded] = useState<Recorded | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async (e: React.FormEvent) => {
    e.preventDefault();
    setError(null);
    setRecorded(null);
    if (!value.trim()) return setError(mode === "code" ? "Scan or type the code from the block's package." : "Type the lot number.");
    setBusy(true);
    const body = mode === "code" ? { elementString: withSeparators(value.trim()) } : { lot: value.trim() };
    const res = await fetch(`/api/appointments/${visitId}/lot`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) }).catch(() => null);
    const json = res ? await res.json().catch(() => ({})) : {};
    setBusy(false);
    if (!res || !res.ok) return setError(json.error ?? "That did not work. Please try again.");
    setRecorded(json as Recorded);
    setValue("");
    router.refresh();
  };

  const inputId = "block-code";
  return (
    <form onSubmit={submit} noValidate className="space-y-3" data-testid="block-lot-form">
      <fieldset className="flex flex-wrap gap-4">
        <legend className="field-label">How to record the block</legend>
        <label className="inline-flex min-h-11 items-center gap-2">
          <input type="radio" name="lot-mode" className="h-5 w-5" checked={mode === "code"} onChange={() => setMode("code")} /> Package code (scan or type)
        </label>
        <label className="inline-flex min-h-11 items-center gap-2">
          <input type="radio" name="lot-mode" className="h-5 w-5" checked={mode === "lot"} onChange={() => setMode("lot")} /> Lot number typed by hand
        </label>
      </fieldset>
      <div>
        <label htmlFor={inputId} className="field-label">{mode === "code" ? "Package code" : "Lot number"}</label>
        <input
          id={inputId}
          className="field-input font-mono"
          value={value}
          onChange={(e) => setValue(e.target.value)}
          autoComplete="off"
          spellCheck={false}
          maxLength={mode === "code" ? 200 : 20}
          aria-invalid={!!error}
          aria-describedby={`${inputId}-hint${error ? ` ${inputId}-e` : ""}`}
        />
        <p id={`${inputId}-hint`} className="mt-1 text-sm text-ink-muted">
          {mode === "code"
            ? "Scan the barcode on the block's package, or type the line printed under it, e.g. (01)…(17)…(10)…. Where a scanner shows a separator, type <GS>."
            : "Up to 20 letters, digits and signs such as - . / as printed after LOT on the package."}
        </p>
        {error ? <p id={`${inputId}-e`} role="alert" className="field-error" data-testid="block-lot-error">{error}</p> : null}
      </div>
      <button type="submit" className="btn-primary" disabled={busy}>{busy ? "Recording…" : "Record block"}</button>
      {recorded ? (
        <p role="status" className="rounded-lg bg-sage-50 p-3 text-sm font-medium text-sage-700" data-testid="block-lot-recorded">
          Recorded lot {recorded.lot}{recorded.expiry ? `, use by ${recorded.expiry}` : ""}{recorded.gtin ? `, GTIN ${recorded.gtin}` : ""}{recorded.serial ? `, serial ${recorded.serial}` : ""}.
        </p>
      ) : null}
    </form>
  );
}
