"use client";

import { useTranslations } from "next-intl";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { SlotPicker, type SlotOption } from "./slot-picker";
import { useSlotWords } from "./slot-words";

type Props = { visitId: string; proposalId: string; materialId: string; mode: string; timezone: string; canChange: boolean; cutoffNote: string; depositNote?: string | null };

/** Move or cancel a visit (patients within the clinic's cut-off; reception any time before it starts). */
export function VisitActions({ visitId, proposalId, materialId, mode, timezone, canChange, cutoffNote, depositNote }: Props) {
  const router = useRouter();
  const t = useTranslations("visit");
  const tc = useTranslations("common");
  const slotText = useSlotWords(timezone);
  const [panel, setPanel] = useState<"none" | "move" | "cancel">("none");
  const [slot, setSlot] = useState<SlotOption | null>(null);
  const [reason, setReason] = useState("");
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);

  async function post(path: string, body: unknown) {
    setBusy(true);
    setMessage(null);
    const res = await fetch(`/api/appointments/${visitId}/${path}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
    const json = await res.json().catch(() => ({}));
    setBusy(false);
    if (!res.ok) {
      setMessage(json.error ?? tc("tryAgain"));
      return;
    }
    setPanel("none");
    router.refresh();
  }

  if (!canChange) return <p className="text-sm text-ink-soft">{cutoffNote}</p>;

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-quiet" aria-expanded={panel === "move"} onClick={() => setPanel(panel === "move" ? "none" : "move")}>{t("move")}</button>
        <button type="button" className="btn-quiet text-clay-700" aria-expanded={panel === "cancel"} onClick={() => setPanel(panel === "cancel" ? "none" : "cancel")}>{t("cancel")}</button>
      </div>
      <p className="text-sm text-ink-soft">{cutoffNote}</p>
      {message ? <p role="alert" className="rounded-lg bg-clay-50 p-3 text-sm font-medium text-clay-700">{message}</p> : null}
      {panel === "move" ? (
        <div className="card space-y-3">
          <SlotPicker proposalId={proposalId} materialId={materialId} mode={mode} words={slotText.words} locale={slotText.locale} selected={slot} onSelect={setSlot} endpoint={`/api/appointments/${visitId}/availability`} />
          <button type="button" className="btn-primary" disabled={!slot || busy} onClick={() => post("move", { start: slot!.start })}>
            {slot ? t("moveTo", { slot: slot.label }) : t("pickNew")}
          </button>
        </div>
      ) : null}
      {panel === "cancel" ? (
        <div className="card space-y-3">
          <label htmlFor="cancel-reason" className="field-label">{tc("reason")}</label>
          <input id="cancel-reason" className="field-input" value={reason} maxLength={500} onChange={(e) => setReason(e.target.value)} />
          {depositNote ? <p className="rounded-lg bg-harbour-50 p-3 text-sm font-medium" data-testid="cancel-deposit-note">{depositNote}</p> : null}
          <button type="button" className="btn-danger" disabled={busy} onClick={() => post("cancel", reason ? { reason } : {})}>{t("confirmCancel")}</button>
        </div>
      ) : null}
    </div>
  );
}
