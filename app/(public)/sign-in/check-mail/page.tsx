import type { Metadata } from "next";
import Link from "next/link";
import { Brand } from "@/components/brand";

export const metadata: Metadata = { title: "Check your e-mail" };

export default function CheckMailPage() {
  return (
    <main id="main" className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 px-gutter py-10">
      <Brand />
      <section className="card">
        <h1 className="text-2xl font-bold">Check your e-mail</h1>
        <p className="mt-2 text-ink-soft">
          If that address belongs to a patient of the clinic, a sign-in link is on its way. It works once, for 30 minutes.
        </p>
        <p className="mt-4"><Link href="/sign-in">Back to sign in</Link></p>
      </section>
    </main>
  );
}
