"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { staffWithdrawalSchema, WITHDRAWAL_CHANNEL_LABEL, WITHDRAWAL_CHANNELS, type StaffWithdrawal, type StaffWithdrawalInput } from "@/lib/domain/consent-withdrawal";
import { recordWithdrawalAction, type WithdrawalState } from "./withdraw-actions";

/** Staff record a withdrawal the patient made by phone, in person or in writing. */
export function RecordWithdrawal({ consentId, today, nowTime }: { consentId: string; today: string; nowTime: string }) {
  const router = useRouter();
  const [state, setState] = useState<WithdrawalState | null>(null);
  const { register, handleSubmit, formState } = useForm<StaffWithdrawalInput, unknown, StaffWithdrawal>({
    resolver: zodResolver(staffWithdrawalSchema),
    defaultValues: { consentId, byName: "", via: "phone", date: today, time: nowTime, reason: "" },
  });
  const err = (name: keyof StaffWithdrawalInput) => formState.errors[name]?.message ?? (state && !state.ok ? state.fieldErrors?.[name] : undefined);
  return (
    <form
      noValidate
      className="space-y-3"
      onSubmit={handleSubmit(async (v) => {
        const result = await recordWithdrawalAction(v);
        setState(result);
        if (result.ok) router.refresh();
      })}
    >
      {state ? <p role={state.ok ? "status" : "alert"} className={`rounded-lg p-3 text-sm font-medium ${state.ok ? "bg-sage-50 text-sage-700" : "bg-clay-50 text-clay-700"}`}>{state.message}</p> : null}
      <input type="hidden" {...register("consentId")} />
      <div>
        <label htmlFor="wd-by" className="field-label">Who withdrew consent</label>
        <input id="wd-by" className="field-input" placeholder="The patient" aria-invalid={!!err("byName")} aria-describedby={err("byName") ? "wd-by-e" : undefined} {...register("byName")} />
        {err("byName") ? <p id="wd-by-e" className="field-error">{err("byName")}</p> : null}
      </div>
      <fieldset>
        <legend className="field-label">How it reached the clinic</legend>
        <div className="flex flex-wrap gap-3">
          {WITHDRAWAL_CHANNELS.map((c) => (
            <label key={c} className="inline-flex min-h-10 items-center gap-2 text-sm">
              <input type="radio" value={c} className="size-5 accent-harbour-600" {...register("via")} />
              {WITHDRAWAL_CHANNEL_LABEL[c]}
            </label>
          ))}
        </div>
      </fieldset>
      <div className="flex flex-wrap gap-3">
        <div>
          <label htmlFor="wd-date" className="field-label">Date (clinic time)</label>
          <input id="wd-date" type="date" className="field-input" aria-invalid={!!err("date")} {...register("date")} />
          {err("date") ? <p className="field-error">{err("date")}</p> : null}
        </div>
        <div>
          <label htmlFor="wd-time" className="field-label">Time</label>
          <input id="wd-time" type="time" className="field-input" aria-invalid={!!err("time")} {...register("time")} />
          {err("time") ? <p className="field-error">{err("time")}</p> : null}
        </div>
      </div>
      <div>
        <label htmlFor="wd-reason" className="field-label">Reason, if they gave one</label>
        <textarea id="wd-reason" rows={2} className="field-input" {...register("reason")} />
        {err("reason") ? <p className="field-error">{err("reason")}</p> : null}
      </div>
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>{formState.isSubmitting ? "Recording…" : "Record the withdrawal"}</button>
    </form>
  );
}
