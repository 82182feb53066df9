// The crown blocks recorded on a visit (traceability), with the form to record one.
import { listLotsForVisit } from "@/lib/data/lots";
import { formatLocal } from "@/lib/domain/time-zone";
import { BlockLotForm } from "./block-lot-form";

export async function VisitBlocks({ visitId, clinicId, zone, canRecord, open }: { visitId: string; clinicId: string; zone: string; canRecord: boolean; open: boolean }) {
  const lots = await listLotsForVisit({ clinicId, appointmentId: visitId });
  return (
    <div className="space-y-3">
      {lots.length === 0 ? (
        <p className="text-ink-soft" data-testid="visit-lots-none">No block recorded yet.</p>
      ) : (
        <ul className="divide-y divide-line" data-testid="visit-lots">
          {lots.map((l) => (
            <li key={l.id} className="py-2 text-sm">
              <span className="font-mono font-semibold">Lot {l.lot}</span>
              {l.expiry ? <> · use by <span className="tabular-nums">{l.expiry}</span></> : null}
              {l.gtin ? <> · GTIN <span className="font-mono">{l.gtin}</span></> : null}
              {l.serial ? <> · serial <span className="font-mono">{l.serial}</span></> : null}
              <span className="block text-ink-muted">
                {l.source === "code" ? "From the package code" : "Typed by hand"} · {formatLocal(l.recordedAt, zone)}{l.recordedBy ? ` · ${l.recordedBy}` : ""}
              </span>
            </li>
          ))}
        </ul>
      )}
      {canRecord && open ? <BlockLotForm visitId={visitId} /> : null}
      <p className="text-sm text-ink-muted">
        Cuspal checks the code and the date it is given; check the package and the block themselves before use. The dentist&apos;s
        judgment, local regulations and licensed practice prevail.
      </p>
    </div>
  );
}
