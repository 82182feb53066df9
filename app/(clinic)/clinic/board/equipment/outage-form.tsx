"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { outageSchema, type OutageInput } from "@/lib/domain/outage-schema";

type Affected = { id: string; patientName: string; start: string; tooth: string };
type Result = { ok: true; affected: Affected[] } | { ok: false; message: string };

export function OutageForm({ equipment }: { equipment: { id: string; label: string }[] }) {
  const router = useRouter();
  const [result, setResult] = useState<Result | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<OutageInput>({
    resolver: zodResolver(outageSchema),
    defaultValues: { equipmentId: equipment[0]?.id ?? "", start: "", end: "", reason: "" },
  });
  const { errors, isSubmitting } = formState;

  const onSubmit = handleSubmit(async (values) => {
    setResult(null);
    const res = await fetch("/api/board/outages", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(values) });
    const body = await res.json().catch(() => ({}));
    if (!res.ok) {
      if (body.field && body.field in values) setError(body.field as keyof OutageInput, { message: body.error });
      setResult({ ok: false, message: body.error ?? "That did not work. Please try again." });
      return;
    }
    setResult({ ok: true, affected: body.affected });
    reset({ ...values, start: "", end: "", reason: "" });
    router.refresh();
  });

  const err = (n: keyof OutageInput) => errors[n]?.message;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3">
      {result?.ok === false ? <p role="alert" className="rounded-lg bg-clay-50 p-3 text-sm font-medium text-clay-700">{result.message}</p> : null}
      {result?.ok ? (
        <div role="status" className="rounded-lg bg-sage-50 p-3 text-sm text-sage-700" data-testid="outage-saved">
          <p className="font-medium">Marked out of service.{result.affected.length === 0 ? " No booked visit needs it then." : ""}</p>
          {result.affected.length > 0 ? (
            <ul className="mt-1 list-disc pl-5 text-ink">
              {result.affected.map((v) => <li key={v.id}><Link href={`/clinic/visits/${v.id}`}>{v.patientName}</Link>, {v.start.slice(0, 10)} {v.start.slice(11, 16)}, tooth {v.tooth}: move this visit</li>)}
            </ul>
          ) : null}
        </div>
      ) : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label htmlFor="outage-eq" className="field-label">Chair, mill or furnace</label>
          <select id="outage-eq" className="field-input" {...register("equipmentId")}>
            {equipment.map((e) => <option key={e.id} value={e.id}>{e.label}</option>)}
          </select>
        </div>
        <div>
          <label htmlFor="outage-reason" className="field-label">Reason (optional)</label>
          <input id="outage-reason" className="field-input" {...register("reason")} />
        </div>
        <div>
          <label htmlFor="outage-start" className="field-label">Out of service from</label>
          <input id="outage-start" type="datetime-local" className="field-input" aria-invalid={!!err("start")} aria-describedby={err("start") ? "outage-start-e" : undefined} {...register("start")} />
          {err("start") ? <p id="outage-start-e" className="field-error">{err("start")}</p> : null}
        </div>
        <div>
          <label htmlFor="outage-end" className="field-label">Back in service at</label>
          <input id="outage-end" type="datetime-local" className="field-input" aria-invalid={!!err("end")} aria-describedby={err("end") ? "outage-end-e" : undefined} {...register("end")} />
          {err("end") ? <p id="outage-end-e" className="field-error">{err("end")}</p> : null}
        </div>
      </div>
      <button type="submit" className="btn-danger" disabled={isSubmitting}>{isSubmitting ? "Saving…" : "Mark out of service"}</button>
    </form>
  );
}

export function EndOutageButton({ id, name, current }: { id: number; name: string; current: boolean }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  return (
    <div>
      <button
        type="button"
        className="btn-quiet"
        onClick={async () => {
          const res = await fetch(`/api/board/outages/${id}`, { method: "DELETE" });
          if (!res.ok) setError((await res.json().catch(() => ({}))).error ?? "That did not work.");
          else router.refresh();
        }}
      >
        {current ? "Back in service now" : "Cancel this range"}<span className="sr-only"> for {name}</span>
      </button>
      {error ? <p role="alert" className="field-error">{error}</p> : null}
    </div>
  );
}
