"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import type { CountryCode } from "libphonenumber-js";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { useForm } from "react-hook-form";
import { LANGUAGE_NAMES, LANGUAGES, registerPatientSchema, type RegisterPatient, type RegisterPatientInput } from "@/lib/domain/patient-record";

type Field = "name" | "email" | "dateOfBirth" | "phone" | "language" | "address" | "reminders";

/** Staff correcting a patient's details: the registration schema, sent as a PATCH (cleared fields become null). */
export function EditDetailsForm({ patientId, country, today, initial }: { patientId: string; country: CountryCode; today: string; initial: RegisterPatientInput }) {
  const router = useRouter();
  const schema = useMemo(() => registerPatientSchema({ country, today }), [country, today]);
  const [status, setStatus] = useState<{ ok: boolean; text: string; existingId?: string } | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<RegisterPatientInput, unknown, RegisterPatient>({ resolver: zodResolver(schema), defaultValues: initial });
  const errors = formState.errors;

  async function submit(v: RegisterPatient) {
    setStatus(null);
    const res = await fetch(`/api/patients/${patientId}`, {
      method: "PATCH",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ ...v, phone: v.phone ?? null, address: v.address ?? null }),
    });
    const body = await res.json().catch(() => ({}));
    if (res.ok) {
      setStatus({ ok: true, text: "Details saved." });
      router.refresh();
    } else if (res.status === 400 && body.field) setError(body.field as Field, { message: body.error });
    else setStatus({ ok: false, text: body.error ?? "Something went wrong. Please try again.", existingId: body.existingId });
  }

  const input = (name: "name" | "email" | "dateOfBirth" | "phone", label: string, type: string) => (
    <div>
      <label htmlFor={`edit-${name}`} className="field-label">{label}</label>
      <input id={`edit-${name}`} type={type} className="field-input" aria-invalid={!!errors[name]} {...register(name)} />
      {errors[name] ? <p className="field-error">{errors[name]?.message}</p> : null}
    </div>
  );
  return (
    <form onSubmit={handleSubmit(submit)} noValidate className="space-y-3" aria-label="Patient details">
      {input("name", "Full name", "text")}
      {input("dateOfBirth", "Date of birth", "date")}
      {input("email", "E-mail", "email")}
      {input("phone", "Mobile phone", "tel")}
      <div>
        <label htmlFor="edit-language" className="field-label">Language</label>
        <select id="edit-language" className="field-input" {...register("language")}>
          {LANGUAGES.map((l) => <option key={l} value={l}>{LANGUAGE_NAMES[l]}</option>)}
        </select>
      </div>
      <div>
        <label htmlFor="edit-address" className="field-label">Postal address</label>
        <textarea id="edit-address" rows={2} className="field-input" {...register("address")} />
        {errors.address ? <p className="field-error">{errors.address.message}</p> : null}
      </div>
      <label className="flex min-h-11 items-center gap-2"><input type="checkbox" className="h-5 w-5" {...register("reminders")} /> Send visit reminders by e-mail</label>
      {status ? (
        <p role={status.ok ? "status" : "alert"} className={status.ok ? "text-sm text-harbour-700" : "text-sm text-clay-700"}>
          {status.text} {status.existingId ? <Link href={`/clinic/patients/${status.existingId}`}>Open that patient</Link> : null}
        </p>
      ) : null}
      <button type="submit" className="btn-quiet" disabled={formState.isSubmitting}>Save details</button>
    </form>
  );
}
