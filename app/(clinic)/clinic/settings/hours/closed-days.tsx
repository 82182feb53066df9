"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { closedDaySchema, type ClosedDayInput } from "@/lib/domain/settings-schemas";
import { addClosedDayAction, removeClosedDayAction, type ActionState } from "../actions";
import { fieldError, FormStatus } from "../form-status";

export function ClosedDays({ days }: { days: { id: number; day: string; reason: string | null }[] }) {
  const [state, setState] = useState<ActionState | null>(null);
  const { register, handleSubmit, formState, reset } = useForm<ClosedDayInput>({ resolver: zodResolver(closedDaySchema), defaultValues: { day: "", reason: "" } });
  const dayErr = fieldError("day", formState.errors.day, state);

  const onSubmit = handleSubmit(async (values) => {
    const result = await addClosedDayAction(values);
    setState(result);
    if (result.ok) reset();
  });

  return (
    <div className="space-y-3">
      <FormStatus state={state} />
      {days.length === 0 ? <p className="text-ink-soft">No closed days.</p> : (
        <ul className="divide-y divide-line">
          {days.map((d) => (
            <li key={d.id} className="flex items-center justify-between gap-3 py-2">
              <span><span className="font-semibold tabular-nums">{d.day}</span>{d.reason ? ` · ${d.reason}` : ""}</span>
              <button type="button" className="btn-quiet" onClick={async () => setState(await removeClosedDayAction(d.id))}>Remove<span className="sr-only"> {d.day}</span></button>
            </li>
          ))}
        </ul>
      )}
      <form onSubmit={onSubmit} noValidate className="flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor="closed-day" className="field-label">Date</label>
          <input id="closed-day" type="date" className="field-input" aria-invalid={!!dayErr} aria-describedby={dayErr ? "closed-day-e" : undefined} {...register("day")} />
          {dayErr ? <p id="closed-day-e" className="field-error">{dayErr}</p> : null}
        </div>
        <div className="min-w-48 flex-1">
          <label htmlFor="closed-reason" className="field-label">Reason (optional)</label>
          <input id="closed-reason" className="field-input" {...register("reason")} />
        </div>
        <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>Add closed day</button>
      </form>
    </div>
  );
}
