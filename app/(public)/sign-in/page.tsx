import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { Brand } from "@/components/brand";
import { LanguageSwitcher } from "@/components/i18n/language-switcher";
import { csrfToken } from "@/lib/auth/csrf";
import { currentUser, homeFor } from "@/lib/auth/session";
import { signInOutcome } from "@/lib/auth/sign-in-errors";
import { SignInForm, type SignInWords } from "./sign-in-form";
import { SignInLinkForm, type SignInLinkWords } from "./sign-in-link-form";

export async function generateMetadata(): Promise<Metadata> {
  return { title: (await getTranslations("signIn"))("title") };
}
export const dynamic = "force-dynamic";

const LINK_ERRORS = { AccessDenied: "errorAccessDenied", Verification: "errorVerification" } as const;

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ error?: string }> }) {
  const user = await currentUser();
  if (user) redirect(homeFor(user.role));
  const { error } = await searchParams;
  const t = await getTranslations("signIn");
  const linkError = error && Object.hasOwn(LINK_ERRORS, error) ? t(LINK_ERRORS[error as keyof typeof LINK_ERRORS]) : null;
  const token = await csrfToken();
  // The forms get their words from here: no message catalogue is sent to the browser.
  const words: SignInWords = {
    email: t("email"), password: t("password"), submit: t("submit"), submitting: t("submitting"), emailInvalid: t("emailInvalid"),
    passwordMissing: t("passwordMissing"), confirmCode: t("confirmCode"), codeLabel: t("codeLabel"), codeHint: t("codeHint"), codeAgain: t("codeAgain"),
    outcomes: { failed: t("failed"), locked: t("locked"), codeFailed: t("codeFailed") },
  };
  const linkWords: SignInLinkWords = { linkEmail: t("linkEmail"), linkSubmit: t("linkSubmit"), linkSending: t("linkSending"), emailInvalid: t("emailInvalid") };
  return (
    <main id="main" className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 px-gutter py-10">
      <div className="flex items-center justify-between gap-3"><Brand /><LanguageSwitcher /></div>
      <section className="card">
        <h1 className="text-2xl font-bold">{t("title")}</h1>
        <p className="mt-1 text-ink-soft">{t("intro")}</p>
        {linkError ? (
          <p role="alert" className="mt-3 rounded-lg bg-clay-50 p-3 text-sm text-clay-700">{linkError}</p>
        ) : null}
        <SignInForm csrfToken={token} words={words} outcome={signInOutcome(error)} />
      </section>
      <section className="card">
        <h2 className="text-lg font-semibold">{t("linkHeading")}</h2>
        <p className="mt-1 text-sm text-ink-soft">{t("linkIntro")}</p>
        {/* next-auth answers an address it cannot use with `?error=EmailSignin`. */}
        <SignInLinkForm csrfToken={token} words={linkWords} invalid={error === "EmailSignin"} />
      </section>
    </main>
  );
}
