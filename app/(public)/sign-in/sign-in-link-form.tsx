"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import { useTranslations } from "next-intl";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { signInLinkSchema } from "@/lib/auth/schemas";

type LinkInput = z.infer<typeof signInLinkSchema>;

export function SignInLinkForm() {
  const t = useTranslations("signIn");
  const { register, handleSubmit, formState } = useForm<LinkInput>({ resolver: zodResolver(signInLinkSchema) });
  const { errors, isSubmitting } = formState;
  const onSubmit = handleSubmit(async ({ email }) => {
    await signIn("email", { email, callbackUrl: "/patient" });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="mt-3 space-y-3">
      <div>
        <label htmlFor="link-email" className="field-label">{t("linkEmail")}</label>
        <input id="link-email" type="email" autoComplete="email" className="field-input" aria-invalid={!!errors.email} aria-describedby={errors.email ? "link-email-error" : undefined} {...register("email")} />
        {errors.email ? <p id="link-email-error" className="field-error">{t("emailInvalid")}</p> : null}
      </div>
      <button type="submit" className="btn-quiet w-full" disabled={isSubmitting}>
        {isSubmitting ? t("linkSending") : t("linkSubmit")}
      </button>
    </form>
  );
}
