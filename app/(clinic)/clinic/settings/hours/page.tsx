import type { Metadata } from "next";
import { requirePageUser } from "@/lib/auth/session";
import { getHours } from "@/lib/data/settings";
import { ClosedDays } from "./closed-days";
import { HoursForm } from "./hours-form";

export const metadata: Metadata = { title: "Opening hours" };

export default async function HoursPage() {
  const user = await requirePageUser(["admin"]);
  const { hours, closedDays } = await getHours({ clinicId: user.clinicId! });
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Opening hours and closed days</h1>
      <section className="card space-y-3" aria-labelledby="hours-heading">
        <h2 id="hours-heading" className="text-lg font-bold">Opening hours</h2>
        <p className="text-sm text-ink-soft">Clinic time. Two intervals on one day make a lunch break. A day without intervals is closed.</p>
        <HoursForm initial={hours} />
      </section>
      <section className="card space-y-3" aria-labelledby="closed-heading">
        <h2 id="closed-heading" className="text-lg font-bold">Closed days</h2>
        <ClosedDays days={closedDays} />
      </section>
    </div>
  );
}
