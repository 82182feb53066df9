"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { signInLinkSchema } from "@/lib/auth/schemas";

type LinkInput = z.infer<typeof signInLinkSchema>;

export function SignInLinkForm() {
  const { register, handleSubmit, formState } = useForm<LinkInput>({ resolver: zodResolver(signInLinkSchema) });
  const { errors, isSubmitting } = formState;
  const onSubmit = handleSubmit(async ({ email }) => {
    await signIn("email", { email, callbackUrl: "/patient" });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="mt-3 space-y-3">
      <div>
        <label htmlFor="link-email" className="field-label">Your e-mail</label>
        <input id="link-email" type="email" autoComplete="email" className="field-input" aria-invalid={!!errors.email} aria-describedby={errors.email ? "link-email-error" : undefined} {...register("email")} />
        {errors.email ? <p id="link-email-error" className="field-error">{errors.email.message}</p> : null}
      </div>
      <button type="submit" className="btn-quiet w-full" disabled={isSubmitting}>
        {isSubmitting ? "Sending…" : "E-mail me a sign-in link"}
      </button>
    </form>
  );
}
