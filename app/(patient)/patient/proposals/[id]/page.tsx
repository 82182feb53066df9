import type { Metadata } from "next";
import Link from "next/link";
import { getTranslations } from "next-intl/server";
import { notFound, redirect } from "next/navigation";
import { CautionsNote } from "@/components/cautions-note";
import { requirePageUser } from "@/lib/auth/session";
import { loadTimeline } from "@/lib/booking/context";
import { clinicOf } from "@/lib/data/clinics";
import { getProposal } from "@/lib/data/proposals";
import { ClientMessages } from "@/components/i18n/client-messages";
import { PlanEstimateDetails } from "@/components/payments/plan-estimate-details";
import { listMaterials } from "@/lib/data/materials";
import { planEstimateOf } from "@/lib/data/payments";
import { patientShareFor } from "@/lib/payments/deposits";
import { money } from "@/lib/format";
import { AppError } from "@/lib/server/errors";
import type { Locale } from "@/lib/i18n/locale";
import { currentLocale } from "@/lib/i18n/server";
import { materialName, materialTexts } from "@/lib/i18n/material-texts";
import { toothWords } from "@/lib/i18n/tooth-words";
import { BookingFlow, type MaterialChoice } from "./booking-flow";

export async function generateMetadata(): Promise<Metadata> {
  return { title: (await getTranslations("proposal"))("title") };
}

function depositNote(clinic: Awaited<ReturnType<typeof clinicOf>>, t: Awaited<ReturnType<typeof getTranslations>>, locale: Locale): string | null {
  if (clinic.depositKind === "none") return null;
  return t("payments.depositAtBooking", {
    kind: clinic.depositKind,
    amount: money(clinic.depositValue, clinic.currency, locale),
    percent: clinic.depositValue,
    hours: clinic.depositRefundHours,
  });
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
  const locale = await currentLocale();
  const t = await getTranslations();

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
    choices.push({
      feeCents: option.feeCents, patientShareCents: share.planShareCents === null ? null : share.patientShareCents,
      id: m.id, name: materialName(m, locale), ...materialTexts(m, locale), heatTreatment: m.heatTreatment, provisionalOnly: m.indications.provisionalOnly, modes,
    });
  }

  return (
    <div className="mx-auto max-w-read space-y-5">
      <p><Link href="/patient">{t("visit.backHome")}</Link></p>
      <header>
        <p className="text-sm font-semibold text-harbour-700">{t("common.toothLine", { fdi: view.tooth.fdi, universal: view.tooth.universal })}</p>
        <h1 className="text-2xl font-bold first-letter:uppercase">{toothWords(view.tooth.fdi, locale)}</h1>
        {view.note ? <p className="mt-1 text-ink-soft" data-free-text>{t("proposal.dentistNote", { dentist: view.dentist.name ?? "", note: view.note })}</p> : null}
      </header>
      {/* Only the messages the booking flow and the plan form read reach the browser. */}
      <ClientMessages namespaces={["booking", "modes", "slots", "payments.planForm"]}>
        <PlanEstimateDetails summary={t("payments.planSummary")} caution={t("payments.planCaution")} proposalId={view.id} initial={estimate ? { coveragePercent: String(estimate.coveragePercent), deductibleRemaining: (estimate.deductibleRemainingCents / 100).toFixed(2), annualMaxRemaining: (estimate.annualMaxRemainingCents / 100).toFixed(2), preauthReference: estimate.preauthReference ?? "" } : {}} />
        <BookingFlow locale={locale} proposalId={view.id} currency={clinic.currency} depositNote={depositNote(clinic, t, locale)} timezone={clinic.timeZone} choices={choices} />
      </ClientMessages>
      <CautionsNote />
    </div>
  );
}
