import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Settings" };

const CARDS = [
  { href: "/clinic/settings/hours", title: "Opening hours and closed days", text: "When visits can be booked, with lunch breaks and holidays." },
  { href: "/clinic/settings/equipment", title: "Chairs, mills and furnaces", text: "The equipment visits are planned on. Mark something out of service from the day board." },
  { href: "/clinic/settings/durations", title: "Stage durations", text: "Minutes per visit stage, and per material and finishing mode." },
  { href: "/clinic/settings/plan", title: "Visit plan", text: "The order of stages per material, furnace programmes and which furnaces can run them." },
  { href: "/clinic/settings/stage-times", title: "Estimated against actual", text: "How long stages really take, to tune the durations." },
  { href: "/clinic/settings/booking", title: "Booking and reminders", text: "Booking grid, buffers, notice, cancellation cut-off and reminder timing." },
  { href: "/clinic/settings/staff", title: "Staff accounts", text: "Who can sign in, and as which role." },
];

export default async function SettingsPage() {
  await requirePageUser(["admin"]);
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-bold">Clinic settings</h1>
      <p className="text-ink-soft">Every change is recorded with who made it and when.</p>
      <ul className="grid gap-3 sm:grid-cols-2">
        {CARDS.map((c) => (
          <li key={c.href} className="card">
            <h2 className="text-lg font-bold"><Link href={c.href} className="inline-flex min-h-6 items-center">{c.title}</Link></h2>
            <p className="text-sm text-ink-soft">{c.text}</p>
          </li>
        ))}
      </ul>
    </div>
  );
}
