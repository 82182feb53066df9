"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import { useTranslations } from "next-intl";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { CODE_NEEDED, signInSchema, type SignInInput, SIGN_IN_FAILED } from "@/lib/auth/schemas";

export function SignInForm() {
  const router = useRouter();
  const t = useTranslations("signIn");
  const [message, setMessage] = useState<string | null>(null);
  // Staff who use two-factor sign-in get a second step after a correct password.
  const [askCode, setAskCode] = useState(false);
  const { register, handleSubmit, formState, setFocus } = useForm<SignInInput>({ resolver: zodResolver(signInSchema) });
  const { errors, isSubmitting } = formState;

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const result = await signIn("credentials", { email: values.email, password: values.password, ...(askCode && values.code ? { code: values.code } : {}), redirect: false });
    if (result?.error === CODE_NEEDED) {
      setAskCode(true);
      setTimeout(() => setFocus("code"), 0);
      return;
    }
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
      <div className={askCode ? "hidden" : undefined}>
        <label htmlFor="email" className="field-label">{t("email")}</label>
        <input id="email" type="email" autoComplete="username" className="field-input" aria-invalid={!!errors.email} aria-describedby={errors.email ? "email-error" : undefined} {...register("email")} />
        {errors.email ? <p id="email-error" className="field-error">{t("emailInvalid")}</p> : null}
      </div>
      <div className={askCode ? "hidden" : undefined}>
        <label htmlFor="password" className="field-label">{t("password")}</label>
        <input id="password" type="password" autoComplete="current-password" className="field-input" aria-invalid={!!errors.password} aria-describedby={errors.password ? "password-error" : undefined} {...register("password")} />
        {errors.password ? <p id="password-error" className="field-error">{t("passwordMissing")}</p> : null}
      </div>
      {askCode ? (
        <div>
          <label htmlFor="code" className="field-label">{t("codeLabel")}</label>
          <p id="code-hint" className="text-sm text-ink-soft">{t("codeHint")}</p>
          <input id="code" inputMode="text" autoComplete="one-time-code" className="field-input" aria-describedby="code-hint" {...register("code")} />
        </div>
      ) : null}
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
        {isSubmitting ? t("submitting") : askCode ? t("confirmCode") : t("submit")}
      </button>
    </form>
  );
}
