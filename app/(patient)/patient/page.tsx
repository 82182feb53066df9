import type { Metadata } from "next";
import Link from "next/link";
import { CautionsNote } from "@/components/cautions-note";
import { StatusBadge } from "@/components/visits/status-badge";
import { requirePageUser } from "@/lib/auth/session";
import { patientOf } from "@/lib/data/access";
import { clinicOf } from "@/lib/data/clinics";
import { listProposals } from "@/lib/data/proposals";
import { listPatientVisits } from "@/lib/data/visits";
import { describeTooth } from "@/lib/domain/tooth";
import { money, when } from "@/lib/format";

export const metadata: Metadata = { title: "My crown" };

export default async function PatientHomePage() {
  const user = await requirePageUser(["patient"]);
  const patient = await patientOf(user);
  const [proposals, visits, clinic] = await Promise.all([listProposals({ user }), listPatientVisits({ patientId: patient.id }), clinicOf(user)]);
  const open = proposals.filter((p) => p.status === "open" && !p.activeVisit);
  const zone = clinic!.timeZone;
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Hello, {user.name?.split(" ")[0] ?? "there"}</h1>

      <section aria-labelledby="to-book" className="space-y-3">
        <h2 id="to-book" className="text-lg font-semibold">Crowns to book</h2>
        {open.length === 0 ? (
          <p className="card text-ink-soft">Nothing to book right now. When your dentist proposes a crown, it appears here.</p>
        ) : (
          <ul className="grid gap-3 sm:grid-cols-2">
            {open.map((p) => (
              <li key={p.id} className="card">
                <p className="text-sm font-semibold text-harbour-700">Tooth {p.tooth.fdi} · Universal {p.tooth.universal}</p>
                <h3 className="text-lg font-semibold first-letter:uppercase">{p.tooth.words}</h3>
                {p.note ? <p className="mt-1 text-ink-soft">{p.note}</p> : null}
                <p className="mt-2 text-sm">{p.materials.length} material{p.materials.length === 1 ? "" : "s"} to choose from · fee {money(p.feeCents, clinic!.currency)}</p>
                <Link href={`/patient/proposals/${p.id}`} className="btn-primary mt-3 w-full sm:w-auto">Compare and book</Link>
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="visits" className="space-y-3">
        <h2 id="visits" className="text-lg font-semibold">My visits</h2>
        {visits.length === 0 ? (
          <p className="card text-ink-soft">No visits yet.</p>
        ) : (
          <ul className="space-y-3">
            {visits.map((v) => (
              <li key={v.id} className="card flex flex-wrap items-center justify-between gap-3">
                <div>
                  <p className="font-semibold first-letter:uppercase">{describeTooth(v.tooth).words} · {v.material?.name}</p>
                  <p className="text-sm text-ink-soft">{when(v.startsAt, zone)}</p>
                  <div className="mt-1"><StatusBadge status={v.status} /></div>
                </div>
                <Link href={`/patient/visits/${v.id}`} className="btn-quiet">Open visit</Link>
              </li>
            ))}
          </ul>
        )}
      </section>
      <CautionsNote />
    </div>
  );
}
