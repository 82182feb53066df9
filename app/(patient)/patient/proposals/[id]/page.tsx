import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { CautionsNote } from "@/components/cautions-note";
import { requirePageUser } from "@/lib/auth/session";
import { loadTimeline } from "@/lib/booking/context";
import { clinicOf } from "@/lib/data/clinics";
import { getProposal } from "@/lib/data/proposals";
import { PlanEstimateForm } from "@/components/payments/plan-estimate-form";
import { PLAN_CAUTION } from "@/components/payments/visit-money";
import { listMaterials } from "@/lib/data/materials";
import { planEstimateOf } from "@/lib/data/payments";
import { patientShareFor } from "@/lib/payments/deposits";
import { money } from "@/lib/format";
import { AppError } from "@/lib/server/errors";
import { BookingFlow, type MaterialChoice } from "./booking-flow";

export const metadata: Metadata = { title: "Choose and book" };

function depositNote(clinic: Awaited<ReturnType<typeof clinicOf>>): string | null {
  if (clinic.depositKind === "none") return null;
  const amount = clinic.depositKind === "fixed" ? money(clinic.depositValue, clinic.currency) : `${clinic.depositValue} % of your share`;
  return `After booking, the clinic asks a deposit of ${amount} (never more than your share), paid online within 30 minutes. It is refunded in full if the clinic declines or cancels, or if you cancel at least ${clinic.depositRefundHours} hours before the visit.`;
}

export default async function ProposalPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser(["patient"]);
  const { id } = await params;
  const found = await getProposal({ user, id }).catch((err) => {
    if (err instanceof AppError && err.status === 404) notFound();
    throw err;
  });
  const { row, view } = found;
  if (view.activeVisit) redirect(`/patient/visits/${view.activeVisit.id}`);
  const clinic = await clinicOf(user);
  const catalogue = await listMaterials({ clinicId: row.clinicId });
  const estimate = await planEstimateOf(row.id);

  const choices: MaterialChoice[] = [];
  for (const option of view.materials) {
    const m = catalogue.find((c) => c.id === option.id);
    if (!m) continue;
    const modes = [];
    for (const mode of option.modes) {
      // A mode the clinic cannot make today (e.g. no furnace runs its programme) is not offered.
      const planned = await loadTimeline({ clinicId: row.clinicId, materialId: m.id, mode, tooth: row.tooth }).catch((err) => {
        if (err instanceof AppError && err.status === 422) return null;
        throw err;
      });
      if (planned) modes.push({ mode, totalMinutes: planned.timeline.totalMinutes, finishing: planned.materialMode.finishing });
    }
    if (!modes.length) continue;
    const share = await patientShareFor(row.id, option.feeCents);
    choices.push({ feeCents: option.feeCents, patientShareCents: share.planShareCents === null ? null : share.patientShareCents, id: m.id, name: m.name, description: m.description, pros: m.pros, cautions: m.cautions, heatTreatment: m.heatTreatment, provisionalOnly: m.indications.provisionalOnly, modes });
  }

  return (
    <div className="mx-auto max-w-read space-y-5">
      <p><Link href="/patient">← My crown</Link></p>
      <header>
        <p className="text-sm font-semibold text-harbour-700">Tooth {view.tooth.fdi} · Universal {view.tooth.universal}</p>
        <h1 className="text-2xl font-bold first-letter:uppercase">{view.tooth.words}</h1>
        {view.note ? <p className="mt-1 text-ink-soft">{view.dentist.name}: “{view.note}”</p> : null}
      </header>
      <details className="card text-sm">
        <summary className="cursor-pointer font-semibold">Have a dental plan? Estimate your share of each fee</summary>
        <div className="mt-3">
          <PlanEstimateForm proposalId={view.id} initial={estimate ? { coveragePercent: String(estimate.coveragePercent), deductibleRemaining: (estimate.deductibleRemainingCents / 100).toFixed(2), annualMaxRemaining: (estimate.annualMaxRemainingCents / 100).toFixed(2), preauthReference: estimate.preauthReference ?? "" } : {}} />
          <p className="mt-2 text-xs text-ink-soft">{PLAN_CAUTION}</p>
        </div>
      </details>
      <BookingFlow proposalId={view.id} currency={clinic.currency} depositNote={depositNote(clinic)} timezone={clinic.timeZone} choices={choices} />
      <CautionsNote />
    </div>
  );
}
