"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { templateFormSchema, type TemplateFormInput, type TemplateFormValues } from "@/lib/domain/consent-schemas";
import type { SectionKey } from "@/lib/domain/consent-text";
import { publishTemplate } from "./actions";

type Props = { initial: TemplateFormValues; purposes: Record<SectionKey, string>; nextVersion: number };

export function TemplateForm({ initial, purposes, nextVersion }: Props) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<TemplateFormInput, unknown, TemplateFormValues>({ resolver: zodResolver(templateFormSchema), defaultValues: initial });
  const { errors, isSubmitting } = formState;

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const result = await publishTemplate(values);
    if (result.ok) {
      router.push(`/clinic/consent-templates?published=${result.version}`);
      router.refresh();
      return;
    }
    const match = result.field?.match(/^sections\.(\d+)\.(heading|body)$/);
    const frMatch = result.field?.match(/^fr\.sections\.(\d+)\.(heading|body)$/);
    if (match) setError(`sections.${Number(match[1])}.${match[2] as "heading" | "body"}`, { message: result.error }, { shouldFocus: true });
    else if (frMatch) setError(`fr.sections.${Number(frMatch[1])}.${frMatch[2] as "heading" | "body"}`, { message: result.error }, { shouldFocus: true });
    else if (result.field === "title") setError("title", { message: result.error }, { shouldFocus: true });
    else if (result.field === "fr.title") setError("fr.title", { message: result.error }, { shouldFocus: true });
    else setMessage(result.error);
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5">
      {message ? <p role="alert" className="rounded-lg bg-clay-50 p-3 font-medium text-clay-700">{message}</p> : null}
      <div>
        <label htmlFor="title" className="field-label">Title</label>
        <input id="title" className="field-input" aria-invalid={!!errors.title} aria-describedby={errors.title ? "title-error" : undefined} {...register("title")} />
        {errors.title ? <p id="title-error" className="field-error">{errors.title.message}</p> : null}
      </div>
      {initial.sections.map((s, i) => (
        <fieldset key={s.key} className="card space-y-3">
          <legend className="px-1 text-sm font-semibold text-harbour-700">{purposes[s.key]}</legend>
          <input type="hidden" {...register(`sections.${i}.key`)} />
          <div>
            <label htmlFor={`heading-${s.key}`} className="field-label">Heading</label>
            <input id={`heading-${s.key}`} className="field-input" aria-invalid={!!errors.sections?.[i]?.heading}
              aria-describedby={errors.sections?.[i]?.heading ? `heading-${s.key}-error` : undefined} {...register(`sections.${i}.heading`)} />
            {errors.sections?.[i]?.heading ? <p id={`heading-${s.key}-error`} className="field-error">{errors.sections[i]!.heading!.message}</p> : null}
          </div>
          <div>
            <label htmlFor={`body-${s.key}`} className="field-label">Text</label>
            <textarea id={`body-${s.key}`} rows={8} className="field-input font-[inherit]" aria-invalid={!!errors.sections?.[i]?.body}
              aria-describedby={errors.sections?.[i]?.body ? `body-${s.key}-error` : undefined} {...register(`sections.${i}.body`)} />
            {errors.sections?.[i]?.body ? <p id={`body-${s.key}-error`} className="field-error">{errors.sections[i]!.body!.message}</p> : null}
          </div>
        </fieldset>
      ))}
      <h2 className="pt-4 text-xl font-semibold" lang="en">French text</h2>
      <p className="text-sm text-ink-soft">Patients who read French sign this text. Both languages are published together; keep the placeholders as they are.</p>
      <div lang="fr">
        <label htmlFor="title-fr" className="field-label">Title (French)</label>
        <input id="title-fr" className="field-input" aria-invalid={!!errors.fr?.title} aria-describedby={errors.fr?.title ? "title-fr-error" : undefined} {...register("fr.title")} />
        {errors.fr?.title ? <p id="title-fr-error" className="field-error">{errors.fr.title.message}</p> : null}
      </div>
      {(initial.fr?.sections ?? []).map((s, i) => (
        <fieldset key={`fr-${s.key}`} className="card space-y-3" lang="fr">
          <legend className="px-1 text-sm font-semibold text-harbour-700" lang="en">{purposes[s.key]} (French)</legend>
          <input type="hidden" {...register(`fr.sections.${i}.key`)} />
          <div>
            <label htmlFor={`heading-fr-${s.key}`} className="field-label">Heading (French)</label>
            <input id={`heading-fr-${s.key}`} className="field-input" aria-invalid={!!errors.fr?.sections?.[i]?.heading} {...register(`fr.sections.${i}.heading`)} />
            {errors.fr?.sections?.[i]?.heading ? <p className="field-error">{errors.fr.sections[i]!.heading!.message}</p> : null}
          </div>
          <div>
            <label htmlFor={`body-fr-${s.key}`} className="field-label">Text (French)</label>
            <textarea id={`body-fr-${s.key}`} rows={8} className="field-input font-[inherit]" aria-invalid={!!errors.fr?.sections?.[i]?.body} {...register(`fr.sections.${i}.body`)} />
            {errors.fr?.sections?.[i]?.body ? <p className="field-error">{errors.fr.sections[i]!.body!.message}</p> : null}
          </div>
        </fieldset>
      ))}
      {errors.fr && !errors.fr.title && !errors.fr.sections ? <p className="field-error" role="alert">{errors.fr.message}</p> : null}
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
        {isSubmitting ? "Publishing…" : `Publish as version ${nextVersion}`}
      </button>
    </form>
  );
}
