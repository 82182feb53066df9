import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { Brand } from "@/components/brand";
import { currentUser, homeFor } from "@/lib/auth/session";
import { SignInForm } from "./sign-in-form";
import { SignInLinkForm } from "./sign-in-link-form";

export const metadata: Metadata = { title: "Sign in" };
export const dynamic = "force-dynamic";

const LINK_ERRORS: Record<string, string> = {
  AccessDenied: "That e-mail address has no patient account here. Ask your clinic to invite you.",
  Verification: "That sign-in link has expired or was already used. Ask for a new one.",
};

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ error?: string }> }) {
  const user = await currentUser();
  if (user) redirect(homeFor(user.role));
  const { error } = await searchParams;
  return (
    <main id="main" className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 px-gutter py-10">
      <Brand />
      <section className="card">
        <h1 className="text-2xl font-bold">Sign in</h1>
        <p className="mt-1 text-ink-soft">Patients and clinic staff sign in here.</p>
        {error && LINK_ERRORS[error] ? (
          <p role="alert" className="mt-3 rounded-lg bg-clay-50 p-3 text-sm text-clay-700">{LINK_ERRORS[error]}</p>
        ) : null}
        <SignInForm />
      </section>
      <section className="card">
        <h2 className="text-lg font-semibold">Patients: sign in without a password</h2>
        <p className="mt-1 text-sm text-ink-soft">We e-mail you a link that signs you in once.</p>
        <SignInLinkForm />
      </section>
    </main>
  );
}
