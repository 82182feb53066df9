"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useId, useState } from "react";
import { useForm } from "react-hook-form";
import { EQUIPMENT_KIND_LABEL, equipmentSchema, type EquipmentInput } from "@/lib/domain/settings-schemas";
import { saveEquipmentAction, type ActionState } from "../actions";
import { fieldError, FormStatus } from "../form-status";

/** Edits one piece of equipment, or adds one when no item is given. */
export function EquipmentForm({ item }: { item?: { id: string; kind: EquipmentInput["kind"]; name: string; active: boolean } }) {
  const id = useId();
  const [state, setState] = useState<ActionState | null>(null);
  const { register, handleSubmit, formState, reset } = useForm<EquipmentInput>({
    resolver: zodResolver(equipmentSchema),
    defaultValues: item ?? { kind: "chair", name: "", active: true },
  });
  const nameErr = fieldError("name", formState.errors.name, state);

  const onSubmit = handleSubmit(async (values) => {
    const result = await saveEquipmentAction(values);
    setState(result);
    if (result.ok && !item) reset({ kind: values.kind, name: "", active: true });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-2" data-testid={item ? "equipment-row" : "equipment-add"}>
      <div className="flex flex-wrap items-end gap-3">
        {item ? (
          <p className="w-20 text-sm font-semibold text-ink-soft">{EQUIPMENT_KIND_LABEL[item.kind]}</p>
        ) : (
          <div>
            <label htmlFor={`${id}-kind`} className="field-label">Kind</label>
            <select id={`${id}-kind`} className="field-input" {...register("kind")}>
              {Object.entries(EQUIPMENT_KIND_LABEL).map(([k, label]) => <option key={k} value={k}>{label}</option>)}
            </select>
          </div>
        )}
        <div className="min-w-48 flex-1">
          <label htmlFor={`${id}-name`} className={item ? "sr-only" : "field-label"}>Name{item ? ` of ${item.name}` : ""}</label>
          <input id={`${id}-name`} className="field-input" aria-invalid={!!nameErr} aria-describedby={nameErr ? `${id}-name-e` : undefined} {...register("name")} />
        </div>
        <label className="inline-flex min-h-11 items-center gap-2 text-sm">
          <input type="checkbox" className="h-5 w-5" {...register("active")} /> In use{item ? <span className="sr-only"> ({item.name})</span> : null}
        </label>
        <button type="submit" className={item ? "btn-quiet" : "btn-primary"} disabled={formState.isSubmitting}>
          {item ? <>Save<span className="sr-only"> {item.name}</span></> : "Add"}
        </button>
      </div>
      {nameErr ? <p id={`${id}-name-e`} className="field-error">{nameErr}</p> : null}
      <FormStatus state={state} />
    </form>
  );
}
