// The page behind "Turn off reminders" in a reminder e-mail: shows the visit and one button.
// The signed token in the address stands in for signing in; it only controls these reminders.
import type { Metadata } from "next";
import Link from "next/link";
import { Brand } from "@/components/brand";
import { visitForReminderToken } from "@/lib/data/mail";
import { visitWhen } from "@/lib/domain/visit-when";

export const metadata: Metadata = { title: "Visit reminders", robots: { index: false } };
export const dynamic = "force-dynamic";

export default async function ReminderLinkPage({ params, searchParams }: {
  params: Promise<{ token: string }>;
  searchParams: Promise<{ done?: string }>;
}) {
  const { token } = await params;
  const { done } = await searchParams;
  const found = await visitForReminderToken(token);

  return (
    <main id="main" className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 px-gutter py-10">
      <Brand />
      {!found ? (
        <section className="card space-y-2">
          <h1 className="text-2xl font-bold">This link does not work</h1>
          <p className="text-ink-soft">Links stop working 30 days after the visit, and a newer e-mail about a moved visit replaces the link in older ones. It may also have been copied only in part. Open the latest e-mail, or sign in to change your reminders on your visit page.</p>
          <p><Link href="/sign-in">Sign in</Link></p>
        </section>
      ) : (
        <ReminderChoice token={token} done={done} {...found} />
      )}
    </main>
  );
}

function ReminderChoice({ token, done, visit, clinic, upcoming }: { token: string; done?: string } & NonNullable<Awaited<ReturnType<typeof visitForReminderToken>>>) {
  const when = visitWhen(visit.startsAt, visit.endsAt, clinic.timeZone);
  const on = visit.remindersEnabled;
  return (
    <section className="card space-y-4" aria-labelledby="reminders-title">
      <div className="space-y-1">
        <h1 id="reminders-title" className="text-2xl font-bold">Reminders for your crown visit</h1>
        <p className="text-ink-soft">
          {clinic.name}, {when.date} at {when.start} ({when.zoneName})
        </p>
      </div>
      {done ? (
        <p role="status" className="rounded-lg bg-sage-50 p-3 font-medium text-sage-700">
          {done === "off" ? "Done: reminders for this visit are off." : "Done: reminders for this visit are on again."}
        </p>
      ) : null}
      <p>
        Reminders are <strong>{on ? "on" : "off"}</strong> for this visit.{" "}
        {on
          ? "Turning them off stops the reminder e-mails for this visit only. You will still get e-mail if the visit changes."
          : "You will still get e-mail if the visit changes."}
      </p>
      {upcoming || on ? (
        <form method="post" action={`/api/reminders/${encodeURIComponent(token)}`}>
          <input type="hidden" name="enabled" value={on ? "false" : "true"} />
          <button type="submit" className={on ? "btn-quiet" : "btn-primary"}>
            {on ? "Turn off reminders" : "Turn reminders back on"}
          </button>
        </form>
      ) : null}
      <p className="text-sm text-ink-soft">
        Questions? Call {clinic.name}{clinic.phone ? ` on ${clinic.phone}` : ""}.
      </p>
    </section>
  );
}
