"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { materialModesSchema, type MaterialModes, type MaterialModesInput } from "@/lib/domain/settings-schemas";
import { saveMaterialModesAction, type ActionState } from "../actions";
import { fieldError, FormStatus } from "../form-status";

type MaterialRow = {
  id: string;
  name: string;
  heatTreatment: string;
  active: boolean;
  modes: { id: number; mode: string; finishing: string; fabricationMinutes: number; heatTreatmentMinutes: number; finishingMinutes: number }[];
};

const FINISHING = { polish: "polish", stain_glaze: "stain and glaze" } as const;

export function MaterialMinutesForm({ materials }: { materials: MaterialRow[] }) {
  const [state, setState] = useState<ActionState | null>(null);
  const flat = materials.flatMap((m) => m.modes.map((x) => ({ material: m, mode: x })));
  const { register, handleSubmit, formState } = useForm<MaterialModesInput, unknown, MaterialModes>({
    resolver: zodResolver(materialModesSchema),
    defaultValues: { modes: flat.map(({ mode }) => ({ id: mode.id, fabricationMinutes: mode.fabricationMinutes, heatTreatmentMinutes: mode.heatTreatmentMinutes, finishingMinutes: mode.finishingMinutes })) },
  });
  const errors = formState.errors.modes;

  const cell = (i: number, field: "fabricationMinutes" | "heatTreatmentMinutes" | "finishingMinutes", label: string, disabled = false) => {
    const err = fieldError(`modes.${i}.${field}`, errors?.[i]?.[field], state);
    return (
      <td className="py-1 pr-2 align-top">
        <label htmlFor={`mm-${i}-${field}`} className="sr-only">{label}</label>
        <input id={`mm-${i}-${field}`} type="number" inputMode="numeric" min={0} max={480} readOnly={disabled} className={`field-input w-24 ${disabled ? "bg-paper-deep" : ""}`} aria-invalid={!!err} aria-describedby={err ? `mm-${i}-${field}-e` : undefined} {...register(`modes.${i}.${field}`, { valueAsNumber: true })} />
        {err ? <p id={`mm-${i}-${field}-e`} className="field-error">{err}</p> : null}
      </td>
    );
  };

  return (
    <form onSubmit={handleSubmit(async (v) => setState(await saveMaterialModesAction(v)))} noValidate className="space-y-3">
      <FormStatus state={state} testId="material-minutes-status" />
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Minutes per material and finishing mode</caption>
          <thead>
            <tr className="border-b border-line"><th scope="col">Material and mode</th><th scope="col">Fabrication</th><th scope="col">Heat treatment</th><th scope="col">Finishing</th></tr>
          </thead>
          <tbody>
            {flat.map(({ material, mode }, i) => {
              const name = `${material.name}, ${mode.mode}`;
              return (
                <tr key={mode.id} className="border-b border-line">
                  <th scope="row" className="py-1 pr-2 font-normal">
                    <span className="font-semibold">{material.name}</span> · {mode.mode}
                    <span className="block text-xs text-ink-muted">{FINISHING[mode.finishing as keyof typeof FINISHING] ?? mode.finishing}{material.active ? "" : " · not offered"}</span>
                  </th>
                  {cell(i, "fabricationMinutes", `${name}: fabrication minutes`)}
                  {cell(i, "heatTreatmentMinutes", `${name}: heat-treatment minutes${material.heatTreatment === "none" ? " (no heat treatment)" : ""}`, material.heatTreatment === "none")}
                  {cell(i, "finishingMinutes", `${name}: finishing minutes`)}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>Save material minutes</button>
    </form>
  );
}
