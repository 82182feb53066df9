"use client";
// A plain HTML form posted to next-auth's credentials callback: it works without JavaScript (the
// answer is a redirect, with `?error=` on failure). With JavaScript the same fields are sent by
// fetch, so the two-factor step keeps what was typed. The browser gets no form or schema library:
// the server checks every field with the shared schema (lib/auth/schemas.ts).
import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { CODE_NEEDED, signInOutcome, type SignInOutcome } from "@/lib/auth/sign-in-errors";

export type SignInWords = {
  email: string; password: string; submit: string; submitting: string; emailInvalid: string; passwordMissing: string;
  confirmCode: string; codeLabel: string; codeHint: string; codeAgain: string;
  outcomes: Record<Exclude<SignInOutcome, "codeNeeded">, string>;
};

type Props = { csrfToken: string; words: SignInWords; outcome: SignInOutcome | null };

export function SignInForm({ csrfToken, words, outcome }: Props) {
  const router = useRouter();
  // Without JavaScript a code request comes back as a new page, so e-mail and password are typed again.
  const codeAgain = outcome === "codeNeeded" || outcome === "codeFailed";
  const [message, setMessage] = useState<string | null>(outcome === "codeNeeded" ? words.codeAgain : outcome ? words.outcomes[outcome] : null);
  const [askCode, setAskCode] = useState(false);
  const [errors, setErrors] = useState<{ email?: boolean; password?: boolean }>({});
  const [submitting, setSubmitting] = useState(false);
  const form = useRef<HTMLFormElement>(null);

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const f = event.currentTarget;
    const email = f.elements.namedItem("email") as HTMLInputElement;
    const password = f.elements.namedItem("password") as HTMLInputElement;
    const found = { email: !email.value.trim() || !email.validity.valid, password: !password.value };
    setErrors(found);
    if (found.email || found.password) {
      (found.email ? email : password).focus();
      return;
    }
    setMessage(null);
    setSubmitting(true);
    try {
      const fields = new URLSearchParams(new FormData(f) as unknown as Record<string, string>);
      // The token next-auth checks against its cookie, fresh in case the page is old.
      const csrf = await fetch("/api/auth/csrf").then((r) => r.json() as Promise<{ csrfToken: string }>);
      fields.set("csrfToken", csrf.csrfToken);
      fields.set("json", "true");
      const res = await fetch(f.action, { method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" }, body: fields });
      const { url } = (await res.json()) as { url?: string };
      const error = url ? new URL(url, window.location.href).searchParams.get("error") : "CredentialsSignin";
      if (!error && res.ok) {
        router.replace("/portal");
        router.refresh();
        return;
      }
      if (error === CODE_NEEDED) {
        setAskCode(true);
        setSubmitting(false);
        setTimeout(() => (form.current?.elements.namedItem("code") as HTMLInputElement | null)?.focus(), 0);
        return;
      }
      const result = signInOutcome(error);
      setMessage(words.outcomes[result && result !== "codeNeeded" ? result : "failed"]);
    } catch {
      setMessage(words.outcomes.failed);
    }
    setSubmitting(false);
  }

  const showCode = askCode || codeAgain;
  return (
    <form ref={form} method="post" action="/api/auth/callback/credentials" onSubmit={onSubmit} noValidate className="mt-4 space-y-4">
      <input type="hidden" name="csrfToken" value={csrfToken} />
      <input type="hidden" name="callbackUrl" value="/portal" />
      {message ? (
        <p role="alert" className="rounded-lg bg-clay-50 p-3 text-sm font-medium text-clay-700" data-testid="sign-in-error">
          {message}
        </p>
      ) : null}
      <div className={askCode ? "hidden" : undefined}>
        <label htmlFor="email" className="field-label">{words.email}</label>
        <input id="email" name="email" type="email" required autoComplete="username" className="field-input" aria-invalid={!!errors.email} aria-describedby={errors.email ? "email-error" : undefined} />
        {errors.email ? <p id="email-error" className="field-error">{words.emailInvalid}</p> : null}
      </div>
      <div className={askCode ? "hidden" : undefined}>
        <label htmlFor="password" className="field-label">{words.password}</label>
        <input id="password" name="password" type="password" required autoComplete="current-password" className="field-input" aria-invalid={!!errors.password} aria-describedby={errors.password ? "password-error" : undefined} />
        {errors.password ? <p id="password-error" className="field-error">{words.passwordMissing}</p> : null}
      </div>
      {showCode ? (
        <div>
          <label htmlFor="code" className="field-label">{words.codeLabel}</label>
          <p id="code-hint" className="text-sm text-ink-soft">{words.codeHint}</p>
          <input id="code" name="code" inputMode="text" autoComplete="one-time-code" className="field-input" aria-describedby="code-hint" />
        </div>
      ) : null}
      <button type="submit" className="btn-primary w-full" disabled={submitting}>
        {submitting ? words.submitting : askCode ? words.confirmCode : words.submit}
      </button>
    </form>
  );
}
