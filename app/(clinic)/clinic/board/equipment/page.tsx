import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { listOutages } from "@/lib/data/outages";
import { listEquipment } from "@/lib/data/settings";
import { EndOutageButton, OutageForm } from "./outage-form";

export const metadata: Metadata = { title: "Equipment status" };

const KIND = { chair: "Chair", mill: "Mill", furnace: "Furnace" } as const;

export default async function EquipmentStatusPage() {
  const user = await requirePageUser(STAFF_ROLES);
  const [equipment, outages] = await Promise.all([listEquipment({ clinicId: user.clinicId! }), listOutages({ clinicId: user.clinicId! })]);
  const active = equipment.filter((e) => e.active);
  // Times arrive in clinic time with their offset: show the wall-clock part.
  const when = (iso: string) => `${iso.slice(0, 10)} ${iso.slice(11, 16)}`;
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h1 className="text-2xl font-bold">Equipment status</h1>
        <Link href="/clinic/board" className="inline-flex min-h-6 items-center text-sm font-semibold">Back to the day board</Link>
      </div>

      <section className="card space-y-2" aria-labelledby="now-heading">
        <h2 id="now-heading" className="text-lg font-bold">Right now</h2>
        <ul className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3" data-testid="equipment-now">
          {active.map((e) => {
            const down = outages.find((o) => o.equipmentId === e.id && o.current);
            return (
              <li key={e.id} className="flex items-center justify-between gap-2 rounded-lg border border-line p-2">
                <span><span className="text-xs font-semibold uppercase text-ink-muted">{KIND[e.kind]}</span><span className="block font-semibold">{e.name}</span></span>
                {down ? <span className="chip border-clay-600 bg-clay-50 text-clay-700">Out of service</span> : <span className="chip border-sage-600 bg-sage-50 text-sage-700">In service</span>}
              </li>
            );
          })}
        </ul>
      </section>

      <section className="card space-y-3" aria-labelledby="mark-heading">
        <h2 id="mark-heading" className="text-lg font-bold">Mark out of service</h2>
        <p className="text-sm text-ink-soft">Clinic time. New bookings avoid the range at once; visits already booked on it are listed for reception to move.</p>
        <OutageForm equipment={active.map((e) => ({ id: e.id, label: `${KIND[e.kind]} · ${e.name}` }))} />
      </section>

      <section className="card space-y-3" aria-labelledby="list-heading">
        <h2 id="list-heading" className="text-lg font-bold">Current and coming out-of-service ranges</h2>
        {outages.length === 0 ? <p className="text-ink-soft">Everything is in service.</p> : (
          <ul className="space-y-3" data-testid="outage-list">
            {outages.map((o) => (
              <li key={o.id} className="rounded-lg border border-line p-3" data-testid="outage">
                <div className="flex flex-wrap items-start justify-between gap-2">
                  <p>
                    <span className="font-semibold">{o.equipmentName}</span>: {when(o.start)} to {when(o.end)}
                    {o.current ? <span className="chip ml-2 border-clay-600 bg-clay-50 text-clay-700">now</span> : null}
                    {o.reason ? <span className="block text-sm text-ink-soft">{o.reason}</span> : null}
                  </p>
                  <EndOutageButton id={o.id} name={o.equipmentName} current={o.current} />
                </div>
                {o.affected.length === 0 ? (
                  <p className="mt-1 text-sm text-sage-700">No booked visit needs it then.</p>
                ) : (
                  <div className="mt-2">
                    <p className="text-sm font-semibold text-clay-700">{o.affected.length} booked {o.affected.length === 1 ? "visit needs" : "visits need"} it: move {o.affected.length === 1 ? "it" : "them"}.</p>
                    <ul className="mt-1 space-y-1 text-sm">
                      {o.affected.map((v) => (
                        <li key={v.id}>
                          <Link href={`/clinic/visits/${v.id}`} className="inline-flex min-h-6 items-center font-semibold">{v.patientName}</Link>{" "}
                          · {when(v.start)} · tooth {v.tooth} · {v.material} · {v.stages.join(", ").replaceAll("_", " ")}
                        </li>
                      ))}
                    </ul>
                  </div>
                )}
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
