import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { CautionsNote } from "@/components/cautions-note";
import { requirePageUser } from "@/lib/auth/session";
import { loadTimeline } from "@/lib/booking/context";
import { clinicOf } from "@/lib/data/clinics";
import { getProposal } from "@/lib/data/proposals";
import { listMaterials } from "@/lib/data/materials";
import { AppError } from "@/lib/server/errors";
import { BookingFlow, type MaterialChoice } from "./booking-flow";

export const metadata: Metadata = { title: "Choose and book" };

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
    choices.push({ id: m.id, name: m.name, description: m.description, pros: m.pros, cautions: m.cautions, heatTreatment: m.heatTreatment, provisionalOnly: m.indications.provisionalOnly, modes });
  }

  return (
    <div className="mx-auto max-w-read space-y-5">
      <p><Link href="/patient">← My crown</Link></p>
      <header>
        <p className="text-sm font-semibold text-harbour-700">Tooth {view.tooth.fdi} · Universal {view.tooth.universal}</p>
        <h1 className="text-2xl font-bold first-letter:uppercase">{view.tooth.words}</h1>
        {view.note ? <p className="mt-1 text-ink-soft">{view.dentist.name}: “{view.note}”</p> : null}
      </header>
      <BookingFlow proposalId={view.id} feeCents={view.feeCents} currency={clinic.currency} timezone={clinic.timeZone} choices={choices} />
      <CautionsNote />
    </div>
  );
}
