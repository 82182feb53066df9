import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { findPatientsByLot, listRecentLots } from "@/lib/data/lots";
import { clinicTimeZone } from "@/lib/data/settings";
import { LotTable } from "./lot-table";

export const metadata: Metadata = { title: "Lots" };

export default async function LotsPage({ searchParams }: { searchParams: Promise<{ lot?: string }> }) {
  const user = await requirePageUser(STAFF_ROLES);
  const { lot: raw } = await searchParams;
  const lot = (raw ?? "").trim().slice(0, 40);
  const clinicId = user.clinicId!;
  const [zone, found, recent] = await Promise.all([
    clinicTimeZone({ clinicId }),
    lot ? findPatientsByLot({ clinicId, lot }) : Promise.resolve(null),
    listRecentLots({ clinicId }),
  ]);
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Crown block lots</h1>
      <section className="card space-y-3" aria-labelledby="recall-heading">
        <h2 id="recall-heading" className="text-lg font-bold">Who received a lot?</h2>
        <p className="text-sm text-ink-soft">For a recall: type the lot number from the maker&apos;s notice. Letter case does not matter.</p>
        <form method="get" className="flex flex-wrap items-end gap-3" role="search">
          <div className="min-w-56 flex-1">
            <label htmlFor="lot" className="field-label">Lot number</label>
            <input id="lot" name="lot" defaultValue={lot} className="field-input" autoComplete="off" maxLength={40} />
          </div>
          <button type="submit" className="btn-primary">Find patients</button>
        </form>
        {found ? (
          found.length === 0 ? (
            <p role="status" className="text-ink-soft" data-testid="lot-none">No visit used lot “{lot}”.</p>
          ) : (
            <div data-testid="lot-results">
              <p role="status" className="mb-2 font-semibold">
                {new Set(found.map((f) => f.patientId)).size} {new Set(found.map((f) => f.patientId)).size === 1 ? "patient" : "patients"} received lot “{lot}”.
              </p>
              <LotTable rows={found} zone={zone} caption={`Visits that used lot ${lot}`} showPatient />
            </div>
          )
        ) : null}
      </section>
      <section className="card space-y-3" aria-labelledby="recent-heading">
        <h2 id="recent-heading" className="text-lg font-bold">Latest blocks recorded</h2>
        {recent.length === 0 ? (
          <p className="text-ink-soft">No blocks recorded yet. Record one from a visit&apos;s page.</p>
        ) : (
          <LotTable rows={recent} zone={zone} caption="The 20 blocks recorded last" />
        )}
        <p className="text-sm text-ink-muted">Blocks are recorded on each visit: open it from the <Link href="/clinic/board" className="inline-flex min-h-6 items-center">day board</Link>.</p>
      </section>
    </div>
  );
}
