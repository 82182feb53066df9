import type { Metadata } from "next";
import Link from "next/link";
import { getTranslations } from "next-intl/server";
import { notFound, redirect } from "next/navigation";
import { CautionsNote } from "@/components/cautions-note";
import { Clinic } from "@/db/models";
import { requirePageUser } from "@/lib/auth/session";
import { loadTimeline } from "@/lib/booking/context";
import { getProposal } from "@/lib/data/proposals";
import { listMaterials } from "@/lib/data/materials";
import { AppError } from "@/lib/server/errors";
import { currentLocale } from "@/lib/i18n/server";
import { materialName, materialTexts } from "@/lib/i18n/material-texts";
import { toothWords } from "@/lib/i18n/tooth-words";
import { BookingFlow, type MaterialChoice } from "./booking-flow";

export async function generateMetadata(): Promise<Metadata> {
  return { title: (await getTranslations("proposal"))("title") };
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
  const clinic = (await Clinic.findByPk(row.clinicId))!;
  const catalogue = await listMaterials({ clinicId: row.clinicId });
  const locale = await currentLocale();
  const t = await getTranslations();

  const choices: MaterialChoice[] = [];
  for (const option of view.materials) {
    const m = catalogue.find((c) => c.id === option.id);
    if (!m) continue;
    const modes = [];
    for (const mode of option.modes) {
      const { timeline, materialMode } = await loadTimeline({ clinicId: row.clinicId, materialId: m.id, mode, tooth: row.tooth });
      modes.push({ mode, totalMinutes: timeline.totalMinutes, finishing: materialMode.finishing });
    }
    choices.push({ id: m.id, name: materialName(m, locale), ...materialTexts(m, locale), heatTreatment: m.heatTreatment, provisionalOnly: m.indications.provisionalOnly, modes });
  }

  return (
    <div className="mx-auto max-w-read space-y-5">
      <p><Link href="/patient">{t("visit.backHome")}</Link></p>
      <header>
        <p className="text-sm font-semibold text-harbour-700">{t("common.toothLine", { fdi: view.tooth.fdi, universal: view.tooth.universal })}</p>
        <h1 className="text-2xl font-bold first-letter:uppercase">{toothWords(view.tooth.fdi, locale)}</h1>
        {view.note ? <p className="mt-1 text-ink-soft" data-free-text>{t("proposal.dentistNote", { dentist: view.dentist.name ?? "", note: view.note })}</p> : null}
      </header>
      <BookingFlow locale={locale} proposalId={view.id} feeCents={view.feeCents} currency={clinic.currency} timezone={clinic.timeZone} choices={choices} />
      <CautionsNote />
    </div>
  );
}
