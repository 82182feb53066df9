"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import type { CountryCode } from "libphonenumber-js";
import { useTranslations } from "next-intl";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { useForm } from "react-hook-form";
import { LOCALE_NAMES } from "@/lib/i18n/locale";
import { LANGUAGES, myDetailsFormSchema, type MyDetailsForm as Values, type MyDetailsFormInput } from "@/lib/domain/patient-record";

export function MyDetailsForm({ country, initial, pendingEmail }: { country: CountryCode; initial: MyDetailsFormInput; pendingEmail: string | null }) {
  const t = useTranslations("myDetails");
  const router = useRouter();
  const schema = useMemo(() => myDetailsFormSchema(country), [country]);
  const [status, setStatus] = useState<{ ok: boolean; text: string } | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<MyDetailsFormInput, unknown, Values>({ resolver: zodResolver(schema), defaultValues: initial });
  const errors = formState.errors;

  async function submit(v: Values) {
    setStatus(null);
    const body = { phone: v.phone ?? null, language: v.language, reminders: v.reminders, ...(v.email !== initial.email ? { email: v.email } : {}) };
    const res = await fetch("/api/me", { method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
    const answer = await res.json().catch(() => ({}));
    if (!res.ok) {
      if (res.status === 400 && answer.field) setError(answer.field as keyof Values, { message: answer.error });
      else setStatus({ ok: false, text: answer.error ?? t("failed") });
      return;
    }
    setStatus({ ok: true, text: answer.emailPending ? t("savedEmailPending") : t("saved") });
    router.refresh();
  }

  return (
    <form onSubmit={handleSubmit(submit)} noValidate className="space-y-4" aria-label={t("title")}>
      <div>
        <label htmlFor="me-phone" className="field-label">{t("phone")}</label>
        <input id="me-phone" type="tel" autoComplete="tel" className="field-input" aria-invalid={!!errors.phone} {...register("phone")} />
        {errors.phone ? <p className="field-error">{errors.phone.message}</p> : null}
      </div>
      <fieldset>
        <legend className="field-label">{t("language")}</legend>
        <div className="flex gap-4">
          {LANGUAGES.map((l) => (
            <label key={l} className="inline-flex min-h-11 items-center gap-2"><input type="radio" value={l} className="h-5 w-5" {...register("language")} /> <span lang={l}>{LOCALE_NAMES[l]}</span></label>
          ))}
        </div>
      </fieldset>
      <label className="flex min-h-11 items-center gap-2"><input type="checkbox" className="h-5 w-5" {...register("reminders")} /> {t("reminders")}</label>
      <div>
        <label htmlFor="me-email" className="field-label">{t("email")}</label>
        <input id="me-email" type="email" autoComplete="email" className="field-input" aria-invalid={!!errors.email} aria-describedby="me-email-hint" {...register("email")} />
        <p id="me-email-hint" className="text-sm text-ink-muted">
          {pendingEmail ? t("emailPending", { email: pendingEmail }) : t("emailHint")}
        </p>
        {errors.email ? <p className="field-error">{errors.email.message}</p> : null}
      </div>
      {status ? <p role={status.ok ? "status" : "alert"} className={status.ok ? "text-sm text-harbour-700" : "text-sm text-clay-700"}>{status.text}</p> : null}
      <button type="submit" className="btn-primary w-full sm:w-auto" disabled={formState.isSubmitting}>{t("save")}</button>
    </form>
  );
}
