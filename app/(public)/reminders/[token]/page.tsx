// The page behind "Turn off reminders" in a reminder e-mail: shows the visit and one button.
// The signed token in the address stands in for signing in; it only controls these reminders.
import type { Metadata } from "next";
import Link from "next/link";
import { Brand } from "@/components/brand";
import { visitForReminderToken } from "@/lib/data/mail";
import { getTranslations } from "next-intl/server";
import { localVisitWhen } from "@/lib/i18n/email";
import { currentLocale } from "@/lib/i18n/server";
import type { Locale } from "@/lib/i18n/locale";

export async function generateMetadata(): Promise<Metadata> {
  return { title: (await getTranslations("reminderLink"))("title"), robots: { index: false } };
}
export const dynamic = "force-dynamic";

export default async function ReminderLinkPage({ params, searchParams }: {
  params: Promise<{ token: string }>;
  searchParams: Promise<{ done?: string }>;
}) {
  const { token } = await params;
  const { done } = await searchParams;
  const found = await visitForReminderToken(token);
  const t = await getTranslations("reminderLink");
  const locale = await currentLocale();

  return (
    <main id="main" className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 px-gutter py-10">
      <Brand />
      {!found ? (
        <section className="card space-y-2">
          <h1 className="text-2xl font-bold">{t("broken")}</h1>
          <p className="text-ink-soft">{t("brokenBody")}</p>
          <p><Link href="/sign-in">{t("signIn")}</Link></p>
        </section>
      ) : (
        <ReminderChoice token={token} done={done} {...found} t={t} locale={locale} />
      )}
    </main>
  );
}

function ReminderChoice({ token, done, visit, clinic, upcoming, t, locale }: { token: string; done?: string; t: Awaited<ReturnType<typeof getTranslations<"reminderLink">>>; locale: Locale } & NonNullable<Awaited<ReturnType<typeof visitForReminderToken>>>) {
  const when = localVisitWhen(visit.startsAt, visit.endsAt, clinic.timeZone, locale);
  const on = visit.remindersEnabled;
  return (
    <section className="card space-y-4" aria-labelledby="reminders-title">
      <div className="space-y-1">
        <h1 id="reminders-title" className="text-2xl font-bold">{t("heading")}</h1>
        <p className="text-ink-soft">
          {t("when", { clinic: clinic.name, date: when.date, start: when.start, zone: when.zoneName })}
        </p>
      </div>
      {done ? (
        <p role="status" className="rounded-lg bg-sage-50 p-3 font-medium text-sage-700">
          {done === "off" ? t("doneOff") : t("doneOn")}
        </p>
      ) : null}
      <p>
        {t("state", { on: on ? "yes" : "no" })}{" "}
        {on ? t("onNote") : t("offNote")}
      </p>
      {upcoming || on ? (
        <form method="post" action={`/api/reminders/${encodeURIComponent(token)}`}>
          <input type="hidden" name="enabled" value={on ? "false" : "true"} />
          <button type="submit" className={on ? "btn-quiet" : "btn-primary"}>
            {on ? t("turnOff") : t("turnOn")}
          </button>
        </form>
      ) : null}
      <p className="text-sm text-ink-soft">
        {t("questions", { clinic: clinic.name, phone: clinic.phone ?? "none" })}
      </p>
    </section>
  );
}
