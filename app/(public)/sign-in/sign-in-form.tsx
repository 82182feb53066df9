"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import { useTranslations } from "next-intl";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { signInSchema, type SignInInput, SIGN_IN_FAILED } from "@/lib/auth/schemas";

export function SignInForm() {
  const router = useRouter();
  const t = useTranslations("signIn");
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<SignInInput>({ resolver: zodResolver(signInSchema) });
  const { errors, isSubmitting } = formState;

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const result = await signIn("credentials", { ...values, redirect: false });
    if (!result || result.error) {
      setMessage(result?.error && result.error !== "CredentialsSignin" && result.error !== SIGN_IN_FAILED ? result.error : t("failed"));
      return;
    }
    router.replace("/portal");
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="mt-4 space-y-4">
      {message ? (
        <p role="alert" className="rounded-lg bg-clay-50 p-3 text-sm font-medium text-clay-700" data-testid="sign-in-error">
          {message}
        </p>
      ) : null}
      <div>
        <label htmlFor="email" className="field-label">{t("email")}</label>
        <input id="email" type="email" autoComplete="username" className="field-input" aria-invalid={!!errors.email} aria-describedby={errors.email ? "email-error" : undefined} {...register("email")} />
        {errors.email ? <p id="email-error" className="field-error">{t("emailInvalid")}</p> : null}
      </div>
      <div>
        <label htmlFor="password" className="field-label">{t("password")}</label>
        <input id="password" type="password" autoComplete="current-password" className="field-input" aria-invalid={!!errors.password} aria-describedby={errors.password ? "password-error" : undefined} {...register("password")} />
        {errors.password ? <p id="password-error" className="field-error">{t("passwordMissing")}</p> : null}
      </div>
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
        {isSubmitting ? t("submitting") : t("submit")}
      </button>
    </form>
  );
}
