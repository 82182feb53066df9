"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import { CLINIC_STAGE_KEYS, stageDurationsSchema, type StageDurations, type StageDurationsInput } from "@/lib/domain/settings-schemas";
import { stageLabel } from "@/lib/domain/timeline";
import { saveStageDurationsAction, type ActionState } from "../actions";
import { fieldError, FormStatus } from "../form-status";

const TEETH = { "": "All teeth", anterior: "Front teeth", premolar: "Premolars", molar: "Molars" } as const;

export function StageDurationsForm({ initial }: { initial: StageDurations["rows"] }) {
  const [state, setState] = useState<ActionState | null>(null);
  const order = (s: string) => CLINIC_STAGE_KEYS.indexOf(s as (typeof CLINIC_STAGE_KEYS)[number]);
  const { register, control, handleSubmit, formState } = useForm<StageDurationsInput, unknown, StageDurations>({
    resolver: zodResolver(stageDurationsSchema),
    defaultValues: { rows: [...initial].sort((a, b) => order(a.stage) - order(b.stage) || a.toothClass.localeCompare(b.toothClass)) },
  });
  const { fields, append, remove } = useFieldArray({ control, name: "rows" });
  const errors = formState.errors.rows;
  const rootErr = errors?.root?.message ?? errors?.message ?? (state && !state.ok ? state.fieldErrors?.rows : undefined);

  return (
    <form onSubmit={handleSubmit(async (v) => setState(await saveStageDurationsAction(v)))} noValidate className="space-y-3">
      <FormStatus state={state} testId="durations-status" />
      {rootErr ? <p className="field-error" role="alert">{rootErr}</p> : null}
      <div className="overflow-x-auto">
      <table className="w-full min-w-[36rem] text-left text-sm">
        <caption className="sr-only">Minutes per stage</caption>
        <thead><tr><th scope="col">Stage</th><th scope="col">Teeth</th><th scope="col">Minutes</th><th scope="col"><span className="sr-only">Remove</span></th></tr></thead>
        <tbody>
          {fields.map((f, i) => {
            const minErr = fieldError(`rows.${i}.minutes`, errors?.[i]?.minutes, state);
            const toothErr = fieldError(`rows.${i}.toothClass`, errors?.[i]?.toothClass, state);
            return (
              <tr key={f.id} className="align-top">
                <td className="py-1 pr-2">
                  <label htmlFor={`sd-${i}-stage`} className="sr-only">Stage, row {i + 1}</label>
                  <select id={`sd-${i}-stage`} className="field-input" {...register(`rows.${i}.stage`)}>
                    {CLINIC_STAGE_KEYS.map((k) => <option key={k} value={k}>{stageLabel(k)}</option>)}
                  </select>
                </td>
                <td className="py-1 pr-2">
                  <label htmlFor={`sd-${i}-teeth`} className="sr-only">Teeth, row {i + 1}</label>
                  <select id={`sd-${i}-teeth`} className="field-input" aria-invalid={!!toothErr} aria-describedby={toothErr ? `sd-${i}-teeth-e` : undefined} {...register(`rows.${i}.toothClass`)}>
                    {Object.entries(TEETH).map(([k, label]) => <option key={k} value={k}>{label}</option>)}
                  </select>
                  {toothErr ? <p id={`sd-${i}-teeth-e`} className="field-error">{toothErr}</p> : null}
                </td>
                <td className="py-1 pr-2">
                  <label htmlFor={`sd-${i}-min`} className="sr-only">Minutes, row {i + 1}</label>
                  <input id={`sd-${i}-min`} type="number" inputMode="numeric" min={1} max={480} className="field-input w-28" aria-invalid={!!minErr} aria-describedby={minErr ? `sd-${i}-min-e` : undefined} {...register(`rows.${i}.minutes`, { valueAsNumber: true })} />
                  {minErr ? <p id={`sd-${i}-min-e`} className="field-error">{minErr}</p> : null}
                </td>
                <td className="py-1"><button type="button" className="btn-quiet" onClick={() => remove(i)}>Remove<span className="sr-only"> row {i + 1}</span></button></td>
              </tr>
            );
          })}
        </tbody>
      </table>
      </div>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-quiet" onClick={() => append({ stage: "preparation", toothClass: "molar", minutes: 30 })}>Add a row</button>
        <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>Save stage durations</button>
      </div>
    </form>
  );
}
