"use client";

import { useState, useTransition } from "react";
import { saveJurisdictionAction, type JurisdictionState } from "./jurisdiction-action";

export function JurisdictionForm({ current, options }: { current: string; options: { code: string; label: string }[] }) {
  const [value, setValue] = useState(current);
  const [state, setState] = useState<JurisdictionState | null>(null);
  const [pending, start] = useTransition();
  return (
    <form className="space-y-3" onSubmit={(e) => { e.preventDefault(); start(async () => setState(await saveJurisdictionAction({ jurisdiction: value }))); }}>
      <div>
        <label htmlFor="jurisdiction" className="field-label">Where the clinic practises</label>
        <select id="jurisdiction" className="field-input" value={value} onChange={(e) => setValue(e.target.value)}>
          {options.map((o) => <option key={o.code} value={o.code}>{o.label}</option>)}
        </select>
      </div>
      {state ? <p role={state.ok ? "status" : "alert"} className={state.ok ? "text-sage-700" : "field-error"}>{state.message}</p> : null}
      <button type="submit" className="btn-primary" disabled={pending}>{pending ? "Saving…" : "Save"}</button>
    </form>
  );
}
