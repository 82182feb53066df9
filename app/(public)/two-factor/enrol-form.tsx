"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { enrolSchema, type EnrolInput } from "@/lib/auth/schemas";
import { confirmEnrolmentAction, type EnrolState } from "./actions";

/** The key (as a QR code and as text) and its first code; once confirmed, the recovery codes instead. */
export function EnrolForm({ qrSvg, secret }: { qrSvg: string; secret: string }) {
  const [state, setState] = useState<EnrolState | null>(null);
  const { register, handleSubmit, formState } = useForm<EnrolInput>({ resolver: zodResolver(enrolSchema) });
  const error = formState.errors.code?.message ?? (state && !state.ok ? state.message : null);

  if (state?.ok) {
    return (
      <section className="space-y-3" aria-labelledby="codes-title">
        <h2 id="codes-title" className="text-lg font-bold">Two-factor sign-in is on</h2>
        <p className="text-sm text-ink-soft">
          Keep these recovery codes somewhere safe, away from your phone. Each one signs you in once if your phone is lost.
          They are shown only now.
        </p>
        <ul className="grid grid-cols-2 gap-2 font-mono text-sm" data-testid="recovery-codes">
          {state.recoveryCodes.map((c) => <li key={c} className="rounded-md bg-paper-deep px-2 py-1">{c}</li>)}
        </ul>
        <Link href="/portal" className="btn-primary inline-block no-underline">I have saved them, continue</Link>
      </section>
    );
  }
  return (
    <>
      <ol className="list-decimal space-y-2 pl-5 text-sm">
        <li>Open an authenticator app on your phone (any app for time-based codes).</li>
        <li>Scan this picture with it, or type the key below.</li>
        <li>Enter the 6-digit code the app then shows.</li>
      </ol>
      <div className="mx-auto w-56 max-w-full rounded-lg border border-line bg-white p-2" role="img" aria-label="QR code holding your two-factor key" dangerouslySetInnerHTML={{ __html: qrSvg }} />
      <p className="text-sm">
        Key: <code className="break-all font-mono" data-testid="totp-secret">{secret}</code>
      </p>
      <form onSubmit={handleSubmit(async (v) => setState(await confirmEnrolmentAction(v)))} noValidate className="space-y-3">
        <div>
          <label htmlFor="enrol-code" className="field-label">Code from the app</label>
          <input id="enrol-code" inputMode="numeric" autoComplete="one-time-code" className="field-input" aria-invalid={!!error} aria-describedby={error ? "enrol-code-e" : undefined} {...register("code")} />
          {error ? <p id="enrol-code-e" role="alert" className="field-error">{error}</p> : null}
        </div>
        <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>Turn on two-factor sign-in</button>
      </form>
    </>
  );
}
