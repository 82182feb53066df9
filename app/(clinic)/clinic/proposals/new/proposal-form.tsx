"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import type { z } from "zod";
import { proposalSchema } from "@/lib/booking/schemas";
import { describeTooth, isValidFdi } from "@/lib/domain/tooth";
import { visitLengthRange } from "@/lib/domain/timeline";
import type { Mode, ToothClass } from "@/lib/domain/types";
import { duration, MODE_WORDS } from "@/lib/format";

type Input = z.input<typeof proposalSchema>;
type Output = z.output<typeof proposalSchema>;
type Props = {
  role: string;
  patients: { id: string; name: string }[];
  /** Preselected when the proposal is started from a patient's page. */
  patientId?: string;
  dentists: { id: string; name: string }[];
  materials: {
    id: string;
    name: string;
    toothClasses: string[];
    modes: Mode[];
    cautions: string[];
    provisionalOnly: boolean;
    /** Estimated visit minutes per mode and tooth class. */
    estimates: Partial<Record<Mode, { minutes: Record<ToothClass, number | null>; problem: string | null }>>;
    /** The clinic's list price, as the fee field shows it. */
    listFee: string;
  }[];
};

export function ProposalForm({ role, patients, patientId, dentists, materials }: Props) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const [allowed, setAllowed] = useState<Record<string, Mode[]>>({});
  // Fees start at the clinic's list price; the dentist may change them per proposal.
  const [fees, setFees] = useState<Record<string, string>>(() => Object.fromEntries(materials.map((m) => [m.id, m.listFee])));
  const { register, handleSubmit, control, setValue, formState } = useForm<Input, unknown, Output>({
    resolver: zodResolver(proposalSchema),
    defaultValues: { options: [], note: "", patientId: patientId ?? "" },
  });
  const tooth = useWatch({ control, name: "tooth" });
  const toothInfo = tooth && isValidFdi(String(tooth)) ? describeTooth(Number(tooth)) : null;
  const { errors, isSubmitting } = formState;

  function sync(nextAllowed: Record<string, Mode[]>, nextFees: Record<string, string>) {
    setValue("options", Object.entries(nextAllowed).map(([id, modes]) => ({ materialId: id, modes, ...(nextFees[id]?.trim() ? { fee: Number(nextFees[id].trim()) } : {}) })), { shouldValidate: formState.isSubmitted });
  }

  function toggle(materialId: string, mode: Mode, on: boolean) {
    const next = { ...allowed, [materialId]: on ? [...(allowed[materialId] ?? []), mode] : (allowed[materialId] ?? []).filter((m) => m !== mode) };
    if (!next[materialId].length) delete next[materialId];
    setAllowed(next);
    sync(next, fees);
  }

  function setFee(materialId: string, value: string) {
    const next = { ...fees, [materialId]: value };
    setFees(next);
    sync(allowed, next);
  }

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await fetch("/api/proposals", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(values) });
    const body = await res.json().catch(() => ({}));
    if (!res.ok) return setMessage(body.error ?? "The proposal was not saved.");
    router.push("/clinic");
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="card space-y-4">
      {message ? <p role="alert" className="rounded-lg bg-clay-50 p-3 text-sm font-medium text-clay-700">{message}</p> : null}
      <div>
        <label htmlFor="patientId" className="field-label">Patient</label>
        <select id="patientId" className="field-input" {...register("patientId")}>
          <option value="" disabled>Choose a patient</option>
          {patients.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
        </select>
        {errors.patientId ? <p className="field-error">{errors.patientId.message}</p> : null}
      </div>
      {role === "admin" ? (
        <div>
          <label htmlFor="dentistId" className="field-label">Dentist</label>
          <select id="dentistId" className="field-input" {...register("dentistId")} defaultValue="">
            <option value="" disabled>Choose the dentist</option>
            {dentists.map((d) => <option key={d.id} value={d.id}>{d.name}</option>)}
          </select>
        </div>
      ) : null}
      <div>
        <label htmlFor="tooth" className="field-label">Tooth (ISO 3950, two digits)</label>
        <input id="tooth" inputMode="numeric" className="field-input" placeholder="36" {...register("tooth")} aria-describedby="tooth-help" />
        <p id="tooth-help" className="mt-1 text-sm text-ink-soft" aria-live="polite">{toothInfo ? toothInfo.label : "For example 36 = lower left first molar."}</p>
        {errors.tooth ? <p className="field-error">{errors.tooth.message}</p> : null}
      </div>
      <fieldset>
        <legend className="field-label">Materials and finishes the patient may choose</legend>
        <div className="space-y-2">
          {materials.map((m) => {
            const indicated = !toothInfo || m.toothClasses.includes(toothInfo.toothClass);
            return (
              <div key={m.id} className={`rounded-lg border border-line p-3 ${indicated ? "" : "opacity-60"}`}>
                <p className="font-semibold">{m.name}{indicated ? "" : ` — not indicated for a ${toothInfo!.toothClass} tooth`}</p>
                <div className="mt-1 flex flex-wrap gap-3">
                  {m.modes.map((mode) => {
                    const estimate = m.estimates[mode];
                    const minutes = toothInfo ? estimate?.minutes[toothInfo.toothClass] ?? null : null;
                    const unavailable = estimate?.problem ?? null;
                    return (
                      <label key={mode} className="inline-flex min-h-10 flex-wrap items-center gap-2 text-sm">
                        <input type="checkbox" className="size-5 accent-harbour-600" disabled={!indicated || !!unavailable} checked={allowed[m.id]?.includes(mode) ?? false} onChange={(e) => toggle(m.id, mode, e.target.checked)} />
                        {MODE_WORDS[mode].name}
                        {unavailable ? <span className="text-clay-700">· not offered: {unavailable}</span>
                          : toothInfo && indicated && minutes ? (
                            <span className="text-ink-muted" data-testid={`estimate-${m.id}-${mode}`}>· visit {duration(minutes)} (the patient reads {visitLengthRange(minutes).text})</span>
                          ) : null}
                      </label>
                    );
                  })}
                </div>
                {!toothInfo ? <p className="mt-1 text-xs text-ink-muted">Enter the tooth to see the estimated visit length.</p> : null}
                {m.provisionalOnly ? <p className="mt-1 text-sm font-semibold text-clay-700">Provisional material: a final crown is still needed.</p> : null}
                {m.cautions.length ? (
                  <div className="mt-1 text-sm">
                    <p className="font-semibold text-clay-700">Cautions</p>
                    <ul className="list-disc pl-5 text-ink-soft" data-testid={`cautions-${m.id}`}>{m.cautions.map((c) => <li key={c}>{c}</li>)}</ul>
                  </div>
                ) : null}
                {allowed[m.id] ? (
                  <div className="mt-2">
                    <label htmlFor={`fee-${m.id}`} className="text-sm font-semibold">Fee for {m.name} (CAD)</label>
                    <input id={`fee-${m.id}`} inputMode="decimal" className="field-input" value={fees[m.id] ?? ""} placeholder="Proposal fee below" onChange={(e) => setFee(m.id, e.target.value)} />
                  </div>
                ) : null}
              </div>
            );
          })}
        </div>
        {errors.options ? <p className="field-error">{errors.options.message ?? errors.options.root?.message}</p> : null}
      </fieldset>
      <div>
        <label htmlFor="fee" className="field-label">Fee (CAD)</label>
        <input id="fee" inputMode="decimal" className="field-input" {...register("fee")} />
        {errors.fee ? <p className="field-error">{errors.fee.message}</p> : null}
      </div>
      <div>
        <label htmlFor="note" className="field-label">Note for the patient</label>
        <textarea id="note" rows={3} className="field-input" {...register("note")} />
        {errors.note ? <p className="field-error">{errors.note.message}</p> : null}
      </div>
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>{isSubmitting ? "Saving…" : "Send proposal to the patient"}</button>
    </form>
  );
}
