"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { furnaceProgrammeSchema, type FurnaceProgrammeInput, type FurnaceProgrammeValue } from "@/lib/domain/plan-settings-schemas";
import type { ActionState } from "../actions";
import { fieldError, FormStatus } from "../form-status";
import { deleteFurnaceProgrammeAction, saveFurnaceProgrammeAction } from "./actions";

type Props = {
  programme?: { id: string; name: string; minutes: number; furnaceIds: string[] };
  furnaces: { id: string; name: string; active: boolean }[];
};

export function ProgrammeForm({ programme, furnaces }: Props) {
  const [state, setState] = useState<ActionState | null>(null);
  const prefix = programme ? `fp-${programme.id}` : "fp-new";
  const { register, handleSubmit, formState, reset } = useForm<FurnaceProgrammeInput, unknown, FurnaceProgrammeValue>({
    resolver: zodResolver(furnaceProgrammeSchema),
    defaultValues: { id: programme?.id ?? "", name: programme?.name ?? "", minutes: programme?.minutes ?? 20, furnaceIds: programme?.furnaceIds ?? [] },
  });
  const nameErr = fieldError("name", formState.errors.name, state);
  const minutesErr = fieldError("minutes", formState.errors.minutes, state);
  return (
    <form
      noValidate
      className="space-y-2"
      onSubmit={handleSubmit(async (v) => {
        const result = await saveFurnaceProgrammeAction(v);
        setState(result);
        if (result.ok && !programme) reset();
      })}
    >
      <FormStatus state={state} />
      <input type="hidden" {...register("id")} />
      <div className="flex flex-wrap gap-3">
        <div>
          <label htmlFor={`${prefix}-name`} className="field-label">Programme name</label>
          <input id={`${prefix}-name`} className="field-input" aria-invalid={!!nameErr} {...register("name")} />
          {nameErr ? <p className="field-error">{nameErr}</p> : null}
        </div>
        <div>
          <label htmlFor={`${prefix}-minutes`} className="field-label">Minutes</label>
          <input id={`${prefix}-minutes`} type="number" inputMode="numeric" min={1} max={600} className="field-input w-28" aria-invalid={!!minutesErr} {...register("minutes", { valueAsNumber: true })} />
          {minutesErr ? <p className="field-error">{minutesErr}</p> : null}
        </div>
      </div>
      <fieldset>
        <legend className="field-label">Furnaces that can run it</legend>
        {furnaces.length ? (
          <div className="flex flex-wrap gap-3">
            {furnaces.map((f) => (
              <label key={f.id} className="inline-flex min-h-10 items-center gap-2 text-sm">
                <input type="checkbox" value={f.id} className="size-5 accent-harbour-600" {...register("furnaceIds")} />
                {f.name}{f.active ? "" : " (retired)"}
              </label>
            ))}
          </div>
        ) : <p className="text-sm text-ink-muted">Add a furnace under Equipment first.</p>}
      </fieldset>
      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>{programme ? "Save programme" : "Add programme"}</button>
        {programme ? (
          <button type="button" className="btn-quiet" onClick={async () => setState(await deleteFurnaceProgrammeAction(programme.id))}>Remove</button>
        ) : null}
      </div>
    </form>
  );
}
