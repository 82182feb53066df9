"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { bookingSettingsSchema, type BookingSettings, type BookingSettingsInput } from "@/lib/domain/settings-schemas";
import { saveBookingSettingsAction, type ActionState } from "../actions";
import { fieldError, FormStatus } from "../form-status";

const FIELDS = [
  { name: "bufferMinutes", label: "Chair cleaning buffer (minutes)", hint: "Kept free on a chair after each visit." },
  { name: "minNoticeMinutes", label: "Minimum notice for a booking (minutes)", hint: "How far ahead patients can book at the earliest." },
  { name: "cancelCutoffHours", label: "Online changes close (hours before the visit)", hint: "After this, patients call the clinic to cancel or move." },
] as const;

export function BookingForm({ initial }: { initial: BookingSettingsInput }) {
  const [state, setState] = useState<ActionState | null>(null);
  const { register, handleSubmit, formState } = useForm<BookingSettingsInput, unknown, BookingSettings>({ resolver: zodResolver(bookingSettingsSchema), defaultValues: initial });
  const err = (n: keyof BookingSettingsInput) => fieldError(n, formState.errors[n] as { message?: string } | undefined, state);

  return (
    <form onSubmit={handleSubmit(async (v) => setState(await saveBookingSettingsAction({ ...v, reminderHoursBefore: v.reminderHoursBefore.join(",") })))} noValidate className="max-w-read space-y-4">
      <FormStatus state={state} testId="booking-status" />
      <div>
        <label htmlFor="slotMinutes" className="field-label">Start times every</label>
        <select id="slotMinutes" className="field-input" {...register("slotMinutes", { valueAsNumber: true })}>
          {[5, 10, 15, 20, 30, 60].map((n) => <option key={n} value={n}>{n} minutes</option>)}
        </select>
      </div>
      {FIELDS.map((f) => (
        <div key={f.name}>
          <label htmlFor={f.name} className="field-label">{f.label}</label>
          <input id={f.name} type="number" inputMode="numeric" min={0} className="field-input" aria-invalid={!!err(f.name)} aria-describedby={`${f.name}-hint${err(f.name) ? ` ${f.name}-e` : ""}`} {...register(f.name, { valueAsNumber: true })} />
          <p id={`${f.name}-hint`} className="mt-1 text-sm text-ink-muted">{f.hint}</p>
          {err(f.name) ? <p id={`${f.name}-e`} className="field-error">{err(f.name)}</p> : null}
        </div>
      ))}
      <div>
        <label htmlFor="reminderHoursBefore" className="field-label">Reminders (hours before the visit)</label>
        <input id="reminderHoursBefore" className="field-input" aria-invalid={!!err("reminderHoursBefore")} aria-describedby={`rem-hint${err("reminderHoursBefore") ? " rem-e" : ""}`} {...register("reminderHoursBefore")} />
        <p id="rem-hint" className="mt-1 text-sm text-ink-muted">Up to four, separated by commas, e.g. 48, 2. Leave empty to send none.</p>
        {err("reminderHoursBefore") ? <p id="rem-e" className="field-error">{err("reminderHoursBefore")}</p> : null}
      </div>
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>Save booking settings</button>
    </form>
  );
}
