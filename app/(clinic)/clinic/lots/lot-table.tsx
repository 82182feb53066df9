// A table of recorded crown blocks, with the patient when searching for a recall.
import Link from "next/link";
import type { PatientLotRow, RecallRow } from "@/lib/data/lots";
import { formatLocal } from "@/lib/domain/time-zone";

export function LotTable({ rows, zone, caption, showPatient = false }: { rows: (PatientLotRow | RecallRow)[]; zone: string; caption: string; showPatient?: boolean }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr className="border-b border-line">
            {showPatient ? <th scope="col" className="py-2 pr-3">Patient</th> : null}
            <th scope="col" className="py-2 pr-3">Visit</th>
            <th scope="col" className="py-2 pr-3">Tooth</th>
            <th scope="col" className="py-2 pr-3">Material</th>
            <th scope="col" className="py-2 pr-3">Lot</th>
            <th scope="col" className="py-2 pr-3">GTIN</th>
            <th scope="col" className="py-2 pr-3">Expiry</th>
            <th scope="col" className="py-2 pr-3">Serial</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className="border-b border-line align-top">
              {showPatient && "patientName" in r ? (
                <td className="py-2 pr-3">
                  <Link href={`/clinic/patients/${r.patientId}`} className="inline-flex min-h-6 items-center font-semibold">{r.patientName}</Link>
                  <span className="block text-ink-muted">{r.patientEmail}{r.patientPhone ? ` · ${r.patientPhone}` : ""}</span>
                </td>
              ) : null}
              <td className="py-2 pr-3"><Link href={`/clinic/visits/${r.appointmentId}`} className="inline-flex min-h-6 items-center">{formatLocal(r.visitStart, zone)}</Link></td>
              <td className="py-2 pr-3">{r.tooth}</td>
              <td className="py-2 pr-3">{r.material} · {r.mode}</td>
              <td className="py-2 pr-3 font-mono">{r.lot}</td>
              <td className="py-2 pr-3 font-mono">{r.gtin ?? "—"}</td>
              <td className="py-2 pr-3 tabular-nums">{r.expiry ?? "—"}</td>
              <td className="py-2 pr-3 font-mono">{r.serial ?? "—"}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
