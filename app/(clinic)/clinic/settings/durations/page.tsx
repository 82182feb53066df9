import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser } from "@/lib/auth/session";
import { getDurations } from "@/lib/data/settings";
import { MaterialMinutesForm } from "./material-minutes-form";
import { StageDurationsForm } from "./stage-durations-form";

export const metadata: Metadata = { title: "Stage durations" };

export default async function DurationsPage() {
  const user = await requirePageUser(["admin"]);
  const { stages, materials } = await getDurations({ clinicId: user.clinicId! });
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Stage durations</h1>
      <p className="text-ink-soft">
        Visit timelines are estimated from these minutes. Changes apply to new bookings; booked visits keep their plan.
        Compare with the real times under <Link href="/clinic/settings/stage-times" className="inline-flex min-h-6 items-center">estimated against actual</Link>.
      </p>
      <section className="card space-y-3" aria-labelledby="stages-heading">
        <h2 id="stages-heading" className="text-lg font-bold">Stages at the chair</h2>
        <p className="text-sm text-ink-soft">A row for some teeth only (front teeth, premolars, molars) wins over the row for all teeth.</p>
        <StageDurationsForm initial={stages} />
      </section>
      <section className="card space-y-3" aria-labelledby="materials-heading">
        <h2 id="materials-heading" className="text-lg font-bold">Fabrication, heat treatment and finishing per material and mode</h2>
        <MaterialMinutesForm materials={materials} />
      </section>
    </div>
  );
}
