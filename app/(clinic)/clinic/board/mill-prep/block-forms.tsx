"use client";

import { useActionState } from "react";
import { VITA_CLASSICAL_SHADES } from "@/lib/domain/shades";
import { markBlockLoadedAction, recordVisitBlockAction } from "./actions";

function Status({ state }: { state: { ok: boolean; message: string } | null }) {
  if (!state) return null;
  return <p role={state.ok ? "status" : "alert"} className={`text-sm ${state.ok ? "text-sage-700" : "text-clay-700"}`}>{state.message}</p>;
}

export function LoadedButton({ appointmentId, loaded, label }: { appointmentId: string; loaded: boolean; label: string }) {
  const [state, action, pending] = useActionState(markBlockLoadedAction, null);
  return (
    <form action={action} className="space-y-1">
      <input type="hidden" name="appointmentId" value={appointmentId} />
      <input type="hidden" name="loaded" value={loaded ? "no" : "yes"} />
      <button type="submit" className={loaded ? "btn-quiet" : "btn-primary"} disabled={pending} aria-label={`${loaded ? "Take back the loaded mark" : "Mark the block loaded"} for ${label}`}>
        {loaded ? "Not loaded after all" : "Block loaded"}
      </button>
      <Status state={state} />
    </form>
  );
}

export function BlockForm({ appointmentId, shade, blockSize, label }: { appointmentId: string; shade: string | null; blockSize: string | null; label: string }) {
  const [state, action, pending] = useActionState(recordVisitBlockAction, null);
  return (
    <form action={action} className="flex flex-wrap items-end gap-2">
      <input type="hidden" name="appointmentId" value={appointmentId} />
      <div>
        <label htmlFor={`shade-${appointmentId}`} className="field-label">Shade (VITA classical)</label>
        <select id={`shade-${appointmentId}`} name="shade" defaultValue={shade ?? ""} className="field-input" aria-label={`Shade for ${label}`}>
          <option value="" disabled>Choose</option>
          {VITA_CLASSICAL_SHADES.map((s) => <option key={s} value={s}>{s}</option>)}
        </select>
      </div>
      <div>
        <label htmlFor={`size-${appointmentId}`} className="field-label">Block size</label>
        <input id={`size-${appointmentId}`} name="blockSize" defaultValue={blockSize ?? ""} maxLength={20} className="field-input w-28" />
      </div>
      <button type="submit" className="btn-quiet" disabled={pending}>Save</button>
      <Status state={state} />
    </form>
  );
}
