import type { Metadata } from "next";
import Link from "next/link";
import { getTranslations } from "next-intl/server";
import { Brand } from "@/components/brand";

export async function generateMetadata(): Promise<Metadata> {
  return { title: (await getTranslations("checkMail"))("title") };
}

export default async function CheckMailPage() {
  const t = await getTranslations("checkMail");
  return (
    <main id="main" className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 px-gutter py-10">
      <Brand />
      <section className="card">
        <h1 className="text-2xl font-bold">{t("title")}</h1>
        <p className="mt-2 text-ink-soft">
          {t("body", { minutes: 30 })}
        </p>
        <p className="mt-4"><Link href="/sign-in">{t("back")}</Link></p>
      </section>
    </main>
  );
}
