// "Crown blocks used": every block recorded on this patient's visits, for traceability and recalls.
import Link from "next/link";
import { listLotsForPatient } from "@/lib/data/lots";
import { clinicTimeZone } from "@/lib/data/settings";
import { formatLocal } from "@/lib/domain/time-zone";

export async function PatientBlocks({ clinicId, patientId }: { clinicId: string; patientId: string }) {
  const [rows, zone] = await Promise.all([listLotsForPatient({ clinicId, patientId }), clinicTimeZone({ clinicId })]);
  return (
    <section className="card space-y-2" aria-labelledby="blocks-heading" data-testid="patient-blocks">
      <h2 id="blocks-heading" className="text-lg font-bold">Crown blocks used</h2>
      {rows.length === 0 ? (
        <p className="text-ink-soft">No block recorded for this patient.</p>
      ) : (
        <ul className="divide-y divide-line">
          {rows.map((r) => (
            <li key={r.id} className="py-2 text-sm">
              <span className="font-mono font-semibold">Lot {r.lot}</span>{r.expiry ? ` · use by ${r.expiry}` : ""}{r.gtin ? ` · GTIN ${r.gtin}` : ""}{r.serial ? ` · serial ${r.serial}` : ""}
              <span className="block text-ink-soft">
                {r.material} · {r.mode} · tooth {r.tooth} ·{" "}
                <Link href={`/clinic/visits/${r.appointmentId}`} className="inline-flex min-h-6 items-center">visit of {formatLocal(r.visitStart, zone)}</Link>
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
