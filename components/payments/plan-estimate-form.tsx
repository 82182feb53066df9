"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { planEstimateSchema } from "@/lib/domain/payment-schemas";

type Input = z.input<typeof planEstimateSchema>;
type Output = z.output<typeof planEstimateSchema>;

/** Dental-plan figures from the patient or staff; the shares are computed on the server. */
export function PlanEstimateForm({ proposalId, initial }: { proposalId: string; initial: Partial<Record<keyof Input, string>> }) {
  const router = useRouter();
  const t = useTranslations("payments.planForm");
  const [status, setStatus] = useState<string | null>(null);
  const { register, handleSubmit, getValues, formState: { errors, isSubmitting } } = useForm<Input, unknown, Output>({ resolver: zodResolver(planEstimateSchema), defaultValues: initial as unknown as Input });

  // The typed values go to the server as typed; the same schema parses them there.
  async function onSubmit() {
    const res = await fetch(`/api/proposals/${proposalId}/plan-estimate`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify(getValues()) });
    const body = await res.json().catch(() => ({}));
    setStatus(res.ok ? t("saved") : body.error ?? t("failed"));
    if (res.ok) router.refresh();
  }

  const field = (name: keyof Input, inputMode: "numeric" | "decimal" | "text", label = t(`${name}.label`), hint = t(`${name}.hint`)) => (
    <div>
      <label htmlFor={`plan-${name}`} className="field-label">{label}</label>
      <input id={`plan-${name}`} className="field-input" inputMode={inputMode} aria-describedby={`plan-${name}-hint`} aria-invalid={errors[name] ? true : undefined} {...register(name)} />
      <p id={`plan-${name}-hint`} className="text-xs text-ink-muted">{hint}</p>
      {errors[name] ? <p className="text-sm text-clay-700">{errors[name]?.message}</p> : null}
    </div>
  );

  return (
    <form className="space-y-3" onSubmit={handleSubmit(onSubmit)} noValidate>
      {field("coveragePercent", "numeric")}
      {field("deductibleRemaining", "decimal")}
      {field("annualMaxRemaining", "decimal")}
      {field("preauthReference", "text")}
      <button type="submit" className="btn-quiet" disabled={isSubmitting}>{isSubmitting ? t("saving") : t("save")}</button>
      {status ? <p role="status" className="text-sm">{status}</p> : null}
    </form>
  );
}
