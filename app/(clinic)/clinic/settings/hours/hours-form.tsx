"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import { openingHoursSchema, WEEKDAYS, type OpeningHours, type OpeningHoursInput } from "@/lib/domain/settings-schemas";
import { saveOpeningHoursAction, type ActionState } from "../actions";
import { fieldError, FormStatus } from "../form-status";

export function HoursForm({ initial }: { initial: OpeningHours["hours"] }) {
  const [state, setState] = useState<ActionState | null>(null);
  const { register, control, handleSubmit, formState } = useForm<OpeningHoursInput, unknown, OpeningHours>({
    resolver: zodResolver(openingHoursSchema),
    defaultValues: { hours: initial },
  });
  const { fields, append, remove } = useFieldArray({ control, name: "hours" });
  const errors = formState.errors.hours;

  const onSubmit = handleSubmit(async (values) => setState(await saveOpeningHoursAction(values)));

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3">
      <FormStatus state={state} testId="hours-status" />
      <div className="overflow-x-auto">
      <table className="w-full min-w-[32rem] text-left text-sm">
        <caption className="sr-only">Opening intervals</caption>
        <thead>
          <tr><th scope="col" className="pb-1">Day</th><th scope="col" className="pb-1">Opens</th><th scope="col" className="pb-1">Closes</th><th scope="col" className="pb-1"><span className="sr-only">Remove</span></th></tr>
        </thead>
        <tbody>
          {fields.map((f, i) => {
            const opensErr = fieldError(`hours.${i}.opens`, errors?.[i]?.opens, state);
            const closesErr = fieldError(`hours.${i}.closes`, errors?.[i]?.closes, state);
            return (
              <tr key={f.id} className="align-top">
                <td className="py-1 pr-2">
                  <label htmlFor={`h-${i}-day`} className="sr-only">Day of interval {i + 1}</label>
                  <select id={`h-${i}-day`} className="field-input" {...register(`hours.${i}.weekday`, { valueAsNumber: true })}>
                    {WEEKDAYS.map((d, n) => <option key={d} value={n}>{d}</option>)}
                  </select>
                </td>
                <td className="py-1 pr-2">
                  <label htmlFor={`h-${i}-opens`} className="sr-only">Opens, interval {i + 1}</label>
                  <input id={`h-${i}-opens`} type="time" className="field-input" aria-invalid={!!opensErr} aria-describedby={opensErr ? `h-${i}-opens-e` : undefined} {...register(`hours.${i}.opens`)} />
                  {opensErr ? <p id={`h-${i}-opens-e`} className="field-error">{opensErr}</p> : null}
                </td>
                <td className="py-1 pr-2">
                  <label htmlFor={`h-${i}-closes`} className="sr-only">Closes, interval {i + 1}</label>
                  <input id={`h-${i}-closes`} type="time" className="field-input" aria-invalid={!!closesErr} aria-describedby={closesErr ? `h-${i}-closes-e` : undefined} {...register(`hours.${i}.closes`)} />
                  {closesErr ? <p id={`h-${i}-closes-e`} className="field-error">{closesErr}</p> : null}
                </td>
                <td className="py-1">
                  <button type="button" className="btn-quiet" onClick={() => remove(i)}>Remove<span className="sr-only"> interval {i + 1}</span></button>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      </div>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-quiet" onClick={() => append({ weekday: 1, opens: "08:00", closes: "12:00" })}>Add an interval</button>
        <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>{formState.isSubmitting ? "Saving…" : "Save opening hours"}</button>
      </div>
    </form>
  );
}
