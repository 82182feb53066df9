"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { CAUTIONS_RULE, MATERIAL_TEXT_LIMITS, materialTextsSchema, type MaterialTextsInput, type MaterialTextsValue } from "@/lib/domain/material-text-schemas";
import type { ActionState } from "../actions";
import { fieldError, FormStatus } from "../form-status";
import { saveMaterialTextsAction } from "./actions";

const LANGUAGES = [
  { key: "en", label: "English", lang: "en" },
  { key: "fr", label: "French", lang: "fr" },
] as const;

export function MaterialTextsForm({ values }: { values: MaterialTextsInput }) {
  const [state, setState] = useState<ActionState | null>(null);
  const { register, handleSubmit, formState, getValues } = useForm<MaterialTextsInput, unknown, MaterialTextsValue>({
    resolver: zodResolver(materialTextsSchema),
    defaultValues: values,
  });
  const id = (lang: string, field: string) => `mt-${values.materialId}-${lang}-${field}`;
  return (
    <form
      noValidate
      className="space-y-3"
      // The server parses the form's own text again, so it is sent as typed (lines not yet split).
      onSubmit={handleSubmit(async () => setState(await saveMaterialTextsAction(getValues())))}
    >
      <FormStatus state={state} />
      <input type="hidden" {...register("materialId")} />
      <div className="grid gap-4 md:grid-cols-2">
        {LANGUAGES.map(({ key, label, lang }) => {
          const errors = formState.errors[key];
          const err = (field: "name" | "description" | "pros" | "cautions") => fieldError(`${key}.${field}`, errors?.[field], state);
          return (
            <fieldset key={key} lang={lang} className="space-y-2 rounded-lg border border-line p-3">
              <legend className="px-1 font-semibold">{label}</legend>
              {(["name", "description", "pros", "cautions"] as const).map((field) => {
                const e = err(field);
                const text = { name: "Name", description: "Description", pros: "Advantages (one per line)", cautions: "Cautions (one per line)" }[field];
                const hint =
                  field === "name" ? `Generic name only, up to ${MATERIAL_TEXT_LIMITS.name} characters.`
                  : field === "description" ? `Up to ${MATERIAL_TEXT_LIMITS.description} characters.`
                  : `Up to ${MATERIAL_TEXT_LIMITS.lines} lines of ${MATERIAL_TEXT_LIMITS.line} characters.${field === "cautions" ? ` ${CAUTIONS_RULE}` : ""}`;
                return (
                  <div key={field}>
                    <label htmlFor={id(key, field)} className="field-label">{text}</label>
                    {field === "name" ? (
                      <input id={id(key, field)} className="field-input" aria-invalid={!!e} aria-describedby={id(key, `${field}-hint`)} {...register(`${key}.${field}`)} />
                    ) : (
                      <textarea id={id(key, field)} rows={4} className="field-input" aria-invalid={!!e} aria-describedby={id(key, `${field}-hint`)} {...register(`${key}.${field}`)} />
                    )}
                    <p id={id(key, `${field}-hint`)} className="text-xs text-ink-muted">{hint}</p>
                    {e ? <p className="field-error">{e}</p> : null}
                  </div>
                );
              })}
            </fieldset>
          );
        })}
      </div>
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>Save texts</button>
    </form>
  );
}
