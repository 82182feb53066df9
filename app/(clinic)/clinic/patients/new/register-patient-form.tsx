"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import type { CountryCode } from "libphonenumber-js";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { useForm } from "react-hook-form";
import { LANGUAGE_NAMES, LANGUAGES, registerPatientSchema, type RegisterPatient, type RegisterPatientInput } from "@/lib/domain/patient-record";

type Field = "name" | "email" | "dateOfBirth" | "phone" | "language" | "address" | "reminders";

export function RegisterPatientForm({ country, today }: { country: CountryCode; today: string }) {
  const router = useRouter();
  const schema = useMemo(() => registerPatientSchema({ country, today }), [country, today]);
  const [problem, setProblem] = useState<{ error: string; existingId?: string } | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<RegisterPatientInput, unknown, RegisterPatient>({
    resolver: zodResolver(schema),
    defaultValues: { name: "", email: "", dateOfBirth: "", phone: "", language: "en", address: "", reminders: true },
  });
  const errors = formState.errors;

  async function submit(values: RegisterPatient) {
    setProblem(null);
    const res = await fetch("/api/patients", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(values) });
    const body = await res.json().catch(() => ({ error: "The server did not answer. Please try again." }));
    if (res.status === 201) {
      router.push(`/clinic/patients/${body.id}?registered=1`);
      return;
    }
    if (res.status === 400 && body.field) setError(body.field as Field, { message: body.error });
    else setProblem({ error: body.error ?? "Something went wrong. Please try again.", existingId: body.existingId });
  }

  const text = (name: "name" | "email" | "dateOfBirth" | "phone", label: string, type: string, autoComplete: string, hint?: string) => (
    <div>
      <label htmlFor={`patient-${name}`} className="field-label">{label}</label>
      {hint ? <p id={`patient-${name}-hint`} className="text-sm text-ink-muted">{hint}</p> : null}
      <input
        id={`patient-${name}`}
        type={type}
        autoComplete={autoComplete}
        max={name === "dateOfBirth" ? today : undefined}
        className="field-input"
        aria-invalid={!!errors[name]}
        aria-describedby={[hint ? `patient-${name}-hint` : "", errors[name] ? `patient-${name}-error` : ""].filter(Boolean).join(" ") || undefined}
        {...register(name)}
      />
      {errors[name] ? <p id={`patient-${name}-error`} className="field-error">{errors[name]?.message}</p> : null}
    </div>
  );

  return (
    <form onSubmit={handleSubmit(submit)} noValidate className="card space-y-4" aria-label="New patient">
      {problem ? (
        <div role="alert" className="rounded-lg bg-clay-50 p-3 text-sm text-clay-700" data-testid="register-problem">
          <p>{problem.error}</p>
          {problem.existingId ? <p className="mt-1"><Link href={`/clinic/patients/${problem.existingId}`}>Open the patient already registered</Link></p> : null}
        </div>
      ) : null}
      {text("name", "Full name", "text", "off")}
      {text("dateOfBirth", "Date of birth", "date", "off")}
      {text("email", "E-mail", "email", "off", "The invitation and visit e-mails go here.")}
      {text("phone", "Mobile phone (optional)", "tel", "off", "As the patient gives it; numbers from abroad with their country code (+…).")}
      <fieldset>
        <legend className="field-label">Language for the portal and e-mails</legend>
        <div className="flex gap-4">
          {LANGUAGES.map((l) => (
            <label key={l} className="inline-flex min-h-11 items-center gap-2"><input type="radio" value={l} className="h-5 w-5" {...register("language")} /> {LANGUAGE_NAMES[l]}</label>
          ))}
        </div>
        {errors.language ? <p className="field-error">{errors.language.message}</p> : null}
      </fieldset>
      <div>
        <label htmlFor="patient-address" className="field-label">Postal address (optional)</label>
        <textarea id="patient-address" rows={2} className="field-input" aria-invalid={!!errors.address} {...register("address")} />
        {errors.address ? <p className="field-error">{errors.address.message}</p> : null}
      </div>
      <label className="flex min-h-11 items-center gap-2"><input type="checkbox" className="h-5 w-5" {...register("reminders")} /> Send visit reminders by e-mail</label>
      <button type="submit" className="btn-primary w-full sm:w-auto" disabled={formState.isSubmitting}>{formState.isSubmitting ? "Registering…" : "Register patient"}</button>
    </form>
  );
}
