import type { Metadata } from "next";
import Link from "next/link";
import type { AbstractIntlMessages } from "next-intl";
import { getMessages, getTimeZone, getTranslations } from "next-intl/server";
import { notFound, redirect } from "next/navigation";
import { CautionsNote } from "@/components/cautions-note";
import { requirePageUser } from "@/lib/auth/session";
import { loadTimeline } from "@/lib/booking/context";
import { clinicOf } from "@/lib/data/clinics";
import { getProposal } from "@/lib/data/proposals";
import { pickMessages } from "@/components/i18n/pick-messages";
import { PlanEstimateDetails } from "@/components/payments/plan-estimate-details";
import { listMaterials } from "@/lib/data/materials";
import { planEstimateOf } from "@/lib/data/payments";
import { patientShareFor } from "@/lib/payments/deposits";
import { money } from "@/lib/format";
import { AppError } from "@/lib/server/errors";
import type { Locale } from "@/lib/i18n/locale";
import type { Mode } from "@/lib/domain/types";
import { currentLocale } from "@/lib/i18n/server";
import { materialName, materialTexts } from "@/lib/i18n/material-texts";
import { toothWords } from "@/lib/i18n/tooth-words";
import { visitLengthRange } from "@/lib/domain/timeline";
import { slotWords } from "@/components/visits/slot-words";
import { BookingFlow, type BookingWords, type MaterialChoice } from "./booking-flow";

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
  const length = (lo: number, hi: number) => visitLengthRange(lo, hi, locale).text;
  for (const option of view.materials) {
    const m = catalogue.find((c) => c.id === option.id);
    if (!m) continue;
    const modes: { mode: Mode; totalMinutes: number; finishing: string }[] = [];
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
    const shareCents = share.planShareCents === null ? null : share.patientShareCents;
    const minutes = modes.map((x) => x.totalMinutes);
    // The words and figures are made here, in the reader's language; the browser only shows them.
    const heat = m.heatTreatment === "none" && modes.some((x) => x.finishing === "stain_glaze") ? "glazeOnly" : m.heatTreatment;
    choices.push({
      id: m.id, name: materialName(m, locale), ...materialTexts(m, locale), provisionalOnly: m.indications.provisionalOnly,
      feeText: money(option.feeCents, clinic.currency, locale),
      shareLine: shareCents === null ? null : t("booking.shareAfterPlan", { share: money(shareCents, clinic.currency, locale) }),
      shareText: shareCents === null ? null : t("booking.shareEstimate", { share: money(shareCents, clinic.currency, locale) }),
      visitLine: `${t("booking.visitAbout", { length: length(Math.min(...minutes), Math.max(...minutes)) })} · ${t("booking.furnace", { heat })}`,
      pickTime: t("booking.pickTime", { step: modes.length > 1 ? 3 : 2 }),
      modes: modes.map((x) => {
        const name = t(`modes.${x.mode}.name`);
        const blurb = t(`modes.${x.mode}.blurb`);
        const duration = length(x.totalMinutes, x.totalMinutes);
        return {
          mode: x.mode, name,
          line: t("booking.modeLine", { mode: name, duration }),
          detail: `${blurb} ${t("booking.finishing", { finishing: x.finishing })}`,
          singleTitle: t("booking.singleMode", { mode: name }),
          singleRest: ` · ${duration}. ${blurb}`,
          lengthValue: t("booking.lengthValue", { duration }),
        };
      }),
    });
  }
  const w = (key: string) => t(`booking.${key}`);
  const words: BookingWords = {
    chooseMaterial: w("chooseMaterial"), pros: w("pros"), cautions: w("cautions"), provisionalOnly: w("provisionalOnly"),
    feesNote: `${w("feesNote")}${choices.some((c) => c.shareLine !== null) ? ` ${w("sharesAreEstimates")}` : ""}`,
    chooseFinish: w("chooseFinish"), review: w("review"), material: w("material"), finish: w("finish"), starts: w("starts"),
    length: w("length"), fee: w("fee"), yourShare: w("yourShare"), reviewNote: w("reviewNote"), request: w("request"),
    requesting: w("requesting"), failed: w("failed"),
    slots: slotWords((key, values) => t(`slots.${key}`, values), clinic.timeZone),
  };

  return (
    <div className="mx-auto max-w-read space-y-5">
      <p><Link href="/patient">{t("visit.backHome")}</Link></p>
      <header>
        <p className="text-sm font-semibold text-harbour-700">{t("common.toothLine", { fdi: view.tooth.fdi, universal: view.tooth.universal })}</p>
        <h1 className="text-2xl font-bold first-letter:uppercase">{toothWords(view.tooth.fdi, locale)}</h1>
        {view.note ? <p className="mt-1 text-ink-soft" data-free-text>{t("proposal.dentistNote", { dentist: view.dentist.name ?? "", note: view.note })}</p> : null}
      </header>
      {/* Only the plan form reads messages in the browser: its own, sent along when it is opened. */}
      <PlanEstimateDetails locale={locale} timeZone={await getTimeZone()} messages={pickMessages(await getMessages(), ["payments.planForm"]) as AbstractIntlMessages} summary={t("payments.planSummary")} caution={t("payments.planCaution")} proposalId={view.id} initial={estimate ? { coveragePercent: String(estimate.coveragePercent), deductibleRemaining: (estimate.deductibleRemainingCents / 100).toFixed(2), annualMaxRemaining: (estimate.annualMaxRemainingCents / 100).toFixed(2), preauthReference: estimate.preauthReference ?? "" } : {}} />
      <BookingFlow locale={locale} proposalId={view.id} depositNote={depositNote(clinic, t, locale)} choices={choices} words={words} />
      <CautionsNote />
    </div>
  );
}
