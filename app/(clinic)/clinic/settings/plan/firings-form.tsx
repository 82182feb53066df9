"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { firingAssignmentsSchema, type FiringAssignments, type FiringAssignmentsInput } from "@/lib/domain/plan-settings-schemas";
import type { ActionState } from "../actions";
import { fieldError, FormStatus } from "../form-status";
import { saveFiringAssignmentsAction } from "./actions";

type ModeRow = { id: number; mode: string; finishing: string; heatProgrammeId: string | null; glazeProgrammeId: string | null; glazeFiringMinutes: number; hasGlazeFiring: boolean };
type Props = {
  materials: { id: string; name: string; heatTreatment: string; modes: ModeRow[] }[];
  programmes: { id: string; name: string; minutes: number }[];
};

/** Which furnace programme each firing of each material and mode uses; none: any furnace, the mode's minutes. */
export function FiringsForm({ materials, programmes }: Props) {
  const [state, setState] = useState<ActionState | null>(null);
  const flat = materials.flatMap((m) => m.modes.map((x) => ({ material: m, mode: x })));
  const { register, handleSubmit, formState } = useForm<FiringAssignmentsInput, unknown, FiringAssignments>({
    resolver: zodResolver(firingAssignmentsSchema),
    defaultValues: { modes: flat.map(({ mode }) => ({ id: mode.id, heatProgrammeId: mode.heatProgrammeId ?? "", glazeProgrammeId: mode.glazeProgrammeId ?? "", glazeFiringMinutes: mode.glazeFiringMinutes })) },
  });
  const options = [<option key="" value="">Any furnace (mode minutes)</option>, ...programmes.map((p) => <option key={p.id} value={p.id}>{p.name} · {p.minutes} min</option>)];
  return (
    <form noValidate className="space-y-3" onSubmit={handleSubmit(async (v) => setState(await saveFiringAssignmentsAction(v)))}>
      <FormStatus state={state} testId="firings-status" />
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Furnace programme per material, mode and firing</caption>
          <thead>
            <tr className="border-b border-line"><th scope="col">Material and mode</th><th scope="col">Heat treatment</th><th scope="col">Glaze firing</th><th scope="col">Glaze minutes</th></tr>
          </thead>
          <tbody>
            {flat.map(({ material, mode }, i) => {
              const name = `${material.name}, ${mode.mode}`;
              const err = fieldError(`modes.${i}.glazeFiringMinutes`, formState.errors.modes?.[i]?.glazeFiringMinutes, state);
              return (
                <tr key={mode.id} className="border-b border-line align-top">
                  <th scope="row" className="py-1 pr-2 font-normal"><span className="font-semibold">{material.name}</span> · {mode.mode}</th>
                  <td className="py-1 pr-2">
                    {material.heatTreatment === "none" ? <span className="text-ink-muted">not fired</span> : (
                      <>
                        <label htmlFor={`fa-${i}-heat`} className="sr-only">{name}: heat-treatment programme</label>
                        <select id={`fa-${i}-heat`} className="field-input" {...register(`modes.${i}.heatProgrammeId`)}>{options}</select>
                      </>
                    )}
                  </td>
                  <td className="py-1 pr-2">
                    {mode.hasGlazeFiring ? (
                      <>
                        <label htmlFor={`fa-${i}-glaze`} className="sr-only">{name}: glaze-firing programme</label>
                        <select id={`fa-${i}-glaze`} className="field-input" {...register(`modes.${i}.glazeProgrammeId`)}>{options}</select>
                      </>
                    ) : <span className="text-ink-muted">{mode.finishing === "stain_glaze" ? "glazed in the heat treatment" : "polished"}</span>}
                  </td>
                  <td className="py-1 pr-2">
                    <label htmlFor={`fa-${i}-gm`} className="sr-only">{name}: glaze-firing minutes</label>
                    <input id={`fa-${i}-gm`} type="number" inputMode="numeric" min={0} max={240} readOnly={!mode.hasGlazeFiring} className={`field-input w-20 ${mode.hasGlazeFiring ? "" : "bg-paper-deep"}`} aria-invalid={!!err} {...register(`modes.${i}.glazeFiringMinutes`, { valueAsNumber: true })} />
                    {err ? <p className="field-error">{err}</p> : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>Save firings</button>
    </form>
  );
}
