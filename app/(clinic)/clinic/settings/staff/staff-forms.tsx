"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useId, useState } from "react";
import { useForm } from "react-hook-form";
import { newStaffSchema, STAFF_ROLE_LABEL, staffUpdateSchema, type NewStaffInput, type StaffUpdateInput } from "@/lib/domain/settings-schemas";
import { createStaffAction, endStaffSessionsAction, saveTwoFactorRequirementAction, updateStaffAction, type ActionState } from "../actions";
import { fieldError, FormStatus } from "../form-status";

type Person = { id: string; name: string; email: string; role: StaffUpdateInput["role"]; active: boolean };

export function StaffRowForm({ person, self }: { person: Person; self: boolean }) {
  const id = useId();
  const [state, setState] = useState<ActionState | null>(null);
  const { register, handleSubmit, formState } = useForm<StaffUpdateInput>({ resolver: zodResolver(staffUpdateSchema), defaultValues: { id: person.id, role: person.role, active: person.active } });
  return (
    <form onSubmit={handleSubmit(async (v) => setState(await updateStaffAction(v)))} noValidate className="space-y-2">
      <div className="flex flex-wrap items-center gap-3">
        <p className="min-w-48 flex-1"><span className="font-semibold">{person.name}</span>{self ? " (you)" : ""}<span className="block text-sm text-ink-muted">{person.email}</span></p>
        <label htmlFor={`${id}-role`} className="sr-only">Role of {person.name}</label>
        <select id={`${id}-role`} className="field-input w-auto" {...register("role")}>
          {Object.entries(STAFF_ROLE_LABEL).map(([k, label]) => <option key={k} value={k}>{label}</option>)}
        </select>
        <label className="inline-flex min-h-11 items-center gap-2 text-sm"><input type="checkbox" className="h-5 w-5" {...register("active")} /> Can sign in<span className="sr-only"> ({person.name})</span></label>
        <button type="submit" className="btn-quiet" disabled={formState.isSubmitting}>Save<span className="sr-only"> {person.name}</span></button>
        {self ? null : (
          <button type="button" className="btn-quiet" onClick={async () => setState(await endStaffSessionsAction(person.id))}>
            End sessions<span className="sr-only"> of {person.name}</span>
          </button>
        )}
      </div>
      <FormStatus state={state} />
    </form>
  );
}

export function NewStaffForm() {
  const [state, setState] = useState<ActionState | null>(null);
  const { register, handleSubmit, formState, reset } = useForm<NewStaffInput>({ resolver: zodResolver(newStaffSchema), defaultValues: { name: "", email: "", role: "reception", password: "" } });
  const err = (n: keyof NewStaffInput) => fieldError(n, formState.errors[n], state);
  const field = (n: "name" | "email" | "password", label: string, type = "text", autoComplete = "off") => (
    <div>
      <label htmlFor={`new-${n}`} className="field-label">{label}</label>
      <input id={`new-${n}`} type={type} autoComplete={autoComplete} className="field-input" aria-invalid={!!err(n)} aria-describedby={err(n) ? `new-${n}-e` : undefined} {...register(n)} />
      {err(n) ? <p id={`new-${n}-e`} className="field-error">{err(n)}</p> : null}
    </div>
  );
  return (
    <form
      onSubmit={handleSubmit(async (v) => {
        const result = await createStaffAction(v);
        setState(result);
        if (result.ok) reset();
      })}
      noValidate
      className="max-w-read space-y-3"
    >
      <FormStatus state={state} testId="new-staff-status" />
      {field("name", "Name")}
      {field("email", "E-mail", "email")}
      <div>
        <label htmlFor="new-role" className="field-label">Role</label>
        <select id="new-role" className="field-input" {...register("role")}>
          {Object.entries(STAFF_ROLE_LABEL).map(([k, label]) => <option key={k} value={k}>{label}</option>)}
        </select>
      </div>
      {field("password", "First password (at least 12 characters)", "password", "new-password")}
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>Create account</button>
    </form>
  );
}

export function TwoFactorRequirementForm({ required }: { required: boolean }) {
  const [state, setState] = useState<ActionState | null>(null);
  const [checked, setChecked] = useState(required);
  return (
    <form
      onSubmit={async (e) => {
        e.preventDefault();
        setState(await saveTwoFactorRequirementAction({ required: checked }));
      }}
      className="space-y-2"
    >
      <label className="inline-flex min-h-11 items-center gap-2">
        <input type="checkbox" className="h-5 w-5" checked={checked} onChange={(e) => setChecked(e.target.checked)} />
        Staff sign in with a code from their phone as well as their password
      </label>
      <p className="text-sm text-ink-muted">Staff who have not set it up yet are asked to on their next visit. Patients are not affected.</p>
      <button type="submit" className="btn-quiet">Save sign-in rule</button>
      <FormStatus state={state} />
    </form>
  );
}
