"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { SlotPicker, type SlotOption } from "./slot-picker";
import { useSlotWords } from "./slot-words";

type Props = { visitId: string; proposalId: string; materialId: string; mode: string; timezone: string; patientName: string };

/** Reception's actions on a requested visit: confirm, decline with a reason, or move. */
export function RequestActions({ visitId, proposalId, materialId, mode, timezone, patientName }: Props) {
  const router = useRouter();
  const slotText = useSlotWords(timezone);
  const [panel, setPanel] = useState<"none" | "decline" | "move">("none");
  const [reason, setReason] = useState("");
  const [slot, setSlot] = useState<SlotOption | null>(null);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);

  async function post(path: string, body: unknown = {}) {
    setBusy(true);
    setMessage(null);
    const res = await fetch(`/api/appointments/${visitId}/${path}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
    const json = await res.json().catch(() => ({}));
    setBusy(false);
    if (!res.ok) return setMessage(json.error ?? "That did not work.");
    setPanel("none");
    router.refresh();
  }

  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-primary min-h-10 px-3 text-sm" disabled={busy} onClick={() => post("confirm")} aria-label={`Confirm visit of ${patientName}`}>Confirm</button>
        <button type="button" className="btn-quiet min-h-10 px-3 text-sm" aria-expanded={panel === "move"} onClick={() => setPanel(panel === "move" ? "none" : "move")}>Move</button>
        <button type="button" className="btn-quiet min-h-10 px-3 text-sm text-clay-700" aria-expanded={panel === "decline"} onClick={() => setPanel(panel === "decline" ? "none" : "decline")}>Decline</button>
      </div>
      {message ? <p role="alert" className="text-sm font-medium text-clay-700">{message}</p> : null}
      {panel === "decline" ? (
        <form className="space-y-2" onSubmit={(e) => { e.preventDefault(); post("decline", { reason }); }}>
          <label htmlFor={`reason-${visitId}`} className="field-label">Reason the patient will read</label>
          <textarea id={`reason-${visitId}`} className="field-input" rows={2} value={reason} maxLength={500} onChange={(e) => setReason(e.target.value)} />
          <button type="submit" className="btn-danger min-h-10 px-3 text-sm" disabled={busy}>Decline request</button>
        </form>
      ) : null}
      {panel === "move" ? (
        <div className="space-y-2">
          <SlotPicker proposalId={proposalId} materialId={materialId} mode={mode} words={slotText.words} locale={slotText.locale} selected={slot} onSelect={setSlot} endpoint={`/api/appointments/${visitId}/availability`} />
          <button type="button" className="btn-primary min-h-10 px-3 text-sm" disabled={!slot || busy} onClick={() => post("move", { start: slot!.start })}>{slot ? `Move to ${slot.label}` : "Pick a time"}</button>
        </div>
      ) : null}
    </div>
  );
}
