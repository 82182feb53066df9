"use client";
// A plain HTML form posted to next-auth's e-mail sign-in: it works without JavaScript. With
// JavaScript the address is checked first, so a mistyped one gets its message beside the field.
import { useState } from "react";

export type SignInLinkWords = { linkEmail: string; linkSubmit: string; linkSending: string; emailInvalid: string };

export function SignInLinkForm({ csrfToken, words, invalid }: { csrfToken: string; words: SignInLinkWords; invalid: boolean }) {
  const [error, setError] = useState(invalid);
  const [submitting, setSubmitting] = useState(false);

  function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    const email = event.currentTarget.elements.namedItem("email") as HTMLInputElement;
    const bad = !email.value.trim() || !email.validity.valid;
    setError(bad);
    if (bad) {
      event.preventDefault();
      email.focus();
      return;
    }
    setSubmitting(true);
  }

  return (
    <form method="post" action="/api/auth/signin/email" onSubmit={onSubmit} noValidate className="mt-3 space-y-3">
      <input type="hidden" name="csrfToken" value={csrfToken} />
      <input type="hidden" name="callbackUrl" value="/patient" />
      <div>
        <label htmlFor="link-email" className="field-label">{words.linkEmail}</label>
        <input id="link-email" name="email" type="email" required autoComplete="email" className="field-input" aria-invalid={error} aria-describedby={error ? "link-email-error" : undefined} />
        {error ? <p id="link-email-error" className="field-error">{words.emailInvalid}</p> : null}
      </div>
      <button type="submit" className="btn-quiet w-full" disabled={submitting}>
        {submitting ? words.linkSending : words.linkSubmit}
      </button>
    </form>
  );
}
