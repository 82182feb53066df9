import type { Metadata } from "next";
import Link from "next/link";
import { RequestActions } from "@/components/visits/request-actions";
import { requirePageUser } from "@/lib/auth/session";
import { listVisits } from "@/lib/data/visits";
import { duration, MODE_WORDS, when } from "@/lib/format";

export const metadata: Metadata = { title: "Visit requests" };

export default async function RequestsPage() {
  const user = await requirePageUser(["reception", "admin"]);
  const visits = await listVisits({ user, statuses: ["requested"] });
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-bold">Visit requests</h1>
      <p className="text-ink-soft">Patients asked for these times. Confirming sends them a confirmation; declining tells them your reason.</p>
      {visits.length === 0 ? <p className="card">No requests waiting.</p> : (
        <div className="overflow-x-auto rounded-card border border-line bg-white">
          <table className="w-full min-w-[48rem] text-left text-sm">
            <caption className="sr-only">Requested visits</caption>
            <thead className="bg-paper-deep text-ink-soft">
              <tr>
                <th scope="col" className="p-3">Patient</th>
                <th scope="col" className="p-3">Tooth</th>
                <th scope="col" className="p-3">Material</th>
                <th scope="col" className="p-3">Start</th>
                <th scope="col" className="p-3">Length</th>
                <th scope="col" className="p-3">Actions</th>
              </tr>
            </thead>
            <tbody>
              {visits.map((v) => (
                <tr key={v.id} className="border-t border-line align-top" data-testid="request-row">
                  <td className="p-3 font-semibold"><Link href={`/clinic/visits/${v.id}`}>{v.patientName}</Link></td>
                  <td className="p-3">{v.tooth.fdi} <span className="text-ink-muted">({v.tooth.words})</span></td>
                  <td className="p-3">{v.material} · {MODE_WORDS[v.mode].name}</td>
                  <td className="p-3 whitespace-nowrap">{when(v.start, v.zone)}</td>
                  <td className="p-3">{duration(v.minutes)}</td>
                  <td className="p-3">
                    <RequestActions visitId={v.id} proposalId={v.proposalId} materialId={v.materialId} mode={v.mode} timezone={v.zone} patientName={v.patientName} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
