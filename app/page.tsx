import Link from "next/link";
import { Brand } from "@/components/brand";
import { CautionsNote } from "@/components/cautions-note";
import { currentUser, homeFor } from "@/lib/auth/session";

export const dynamic = "force-dynamic";

const STEPS = [
  { title: "Compare materials", text: "See the crown materials your dentist allows for your tooth, in plain words, with their strengths and cautions." },
  { title: "Book a time that works", text: "Pick a start time when the chair, the dentist, the mill and the furnace are all free for your whole visit." },
  { title: "Answer and sign on your phone", text: "Fill the health questions and sign consent with your finger. You get a sealed PDF copy." },
  { title: "Arrive prepared", text: "Reminders with what to expect: a two-to-three hour visit, numbness afterwards, and what to bring." },
];

export default async function LandingPage() {
  const user = await currentUser();
  return (
    <>
      <header className="mx-auto flex max-w-page items-center justify-between px-gutter py-4">
        <Brand />
        {user ? (
          <Link href={homeFor(user.role)} className="btn-primary">Open your portal</Link>
        ) : (
          <Link href="/sign-in" className="btn-primary">Sign in</Link>
        )}
      </header>
      <main id="main" className="mx-auto max-w-page px-gutter pb-section">
        <section className="py-8 sm:py-14">
          <h1 className="max-w-read text-3xl font-bold tracking-tight sm:text-[2.6rem] sm:leading-[3rem]">
            Your new crown, made and fitted in one visit.
          </h1>
          <p className="mt-4 max-w-read text-lg text-ink-soft">
            Cuspal is your clinic&apos;s portal for same-day crowns. Your dentist scans the prepared tooth, designs the crown
            on screen and has it made in the clinic while you wait. Cuspal gets you ready for that visit.
          </p>
        </section>
        <section aria-labelledby="how" className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <h2 id="how" className="sr-only">How it works</h2>
          {STEPS.map((step, i) => (
            <article key={step.title} className="card">
              <p className="text-sm font-semibold text-harbour-700">Step {i + 1}</p>
              <h3 className="mt-1 text-lg font-semibold">{step.title}</h3>
              <p className="mt-2 text-ink-soft">{step.text}</p>
            </article>
          ))}
        </section>
        <CautionsNote className="mt-section max-w-read" />
      </main>
    </>
  );
}
