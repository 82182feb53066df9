import type { Metadata } from "next";
import Link from "next/link";
import { getTranslations } from "next-intl/server";
import { notFound } from "next/navigation";
import { CautionsNote } from "@/components/cautions-note";
import { ConsentLink } from "@/components/consent/consent-link";
import { ReminderToggle } from "@/components/patient/reminder-toggle";
import { PreVisitNotes } from "@/components/visits/pre-visit-notes";
import { StatusBadge } from "@/components/visits/status-badge";
import { VisitActions } from "@/components/visits/visit-actions";
import { VisitTimeline } from "@/components/visits/visit-timeline";
import { PayDepositButton } from "@/components/payments/pay-deposit-button";
import { PlanEstimateForm } from "@/components/payments/plan-estimate-form";
import { VisitMoney } from "@/components/payments/visit-money";
import { requirePageUser } from "@/lib/auth/session";
import { getVisitMoney } from "@/lib/data/payments";
import { getVisitPage, getVisitTimeline } from "@/lib/data/visits";
import { cancellationDepositNote } from "@/lib/payments/deposits";
import { patientMayChange } from "@/lib/booking/transitions";
import { withDefaults } from "@/lib/domain/clinic-settings";
import { visitLengthRange } from "@/lib/domain/timeline";
import { describeTooth } from "@/lib/domain/tooth";
import { money, when } from "@/lib/format";
import { formatList } from "@/lib/i18n/format";
import { currentLocale } from "@/lib/i18n/server";
import { toothWords } from "@/lib/i18n/tooth-words";
import { materialName, materialTexts } from "@/lib/i18n/material-texts";
import { AppError } from "@/lib/server/errors";

export async function generateMetadata(): Promise<Metadata> {
  return { title: (await getTranslations("visit"))("title") };
}

export default async function PatientVisitPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ deposit?: string }> }) {
  const user = await requirePageUser(["patient"]);
  const { id } = await params;
  const { visit, clinic, material } = await getVisitPage({ user, id }).catch((err) => {
    if (err instanceof AppError && err.status === 404) notFound();
    throw err;
  });
  const [timeline, { money: m }, depositNote, { deposit: returned }] = await Promise.all([
    getVisitTimeline({ user, id }), getVisitMoney({ user }, id), cancellationDepositNote(visit), searchParams,
  ]);
  const estimate = m.planEstimate;
  const zone = clinic!.timeZone;
  const tooth = describeTooth(visit.tooth);
  const minutes = Math.round((visit.endsAt.getTime() - visit.startsAt.getTime()) / 60_000);
  const { cancelCutoffHours, reminderHoursBefore } = withDefaults(clinic!.settings);
  const active = ["requested", "confirmed"].includes(visit.status);
  const canChange = patientMayChange(visit, cancelCutoffHours);
  const locale = await currentLocale();
  const t = await getTranslations();

  return (
    <div className="mx-auto max-w-read space-y-5">
      <p><Link href="/patient">{t("visit.backHome")}</Link></p>
      <header className="space-y-1">
        <p className="text-sm font-semibold text-harbour-700">{t("common.toothLine", { fdi: tooth.fdi, universal: tooth.universal })}</p>
        <h1 className="text-2xl font-bold first-letter:uppercase">{toothWords(tooth.fdi, locale)}</h1>
        <StatusBadge status={visit.status} />
      </header>
      <section className="card" aria-labelledby="summary">
        <h2 id="summary" className="sr-only">{t("visit.summary")}</h2>
        <dl className="grid grid-cols-[6.5rem_1fr] gap-y-1">
          <dt className="text-ink-muted">{t("visit.starts")}</dt><dd data-testid="visit-start">{when(visit.startsAt, zone, locale)}</dd>
          <dt className="text-ink-muted">{t("visit.length")}</dt><dd data-testid="visit-length">{t("visit.lengthEstimate", { length: visitLengthRange(minutes, minutes, locale).text })}</dd>
          <dt className="text-ink-muted">{t("visit.material")}</dt><dd>{material ? materialName(material, locale) : null}</dd>
          <dt className="text-ink-muted">{t("visit.finish")}</dt><dd>{t(`modes.${visit.mode}.name`)}</dd>
          <dt className="text-ink-muted">{t("visit.where")}</dt><dd>{clinic!.name}, {clinic!.address}</dd>
        </dl>
        {material?.provisionalOnly ? <p className="mt-2 text-sm font-semibold text-clay-700">{t("visit.provisional")}</p> : null}
        {material && materialTexts(material, locale).cautions.length ? (
          <div className="mt-2 text-sm">
            <p className="font-semibold">{t("visit.cautionsFor", { material: materialName(material, locale) })}</p>
            <ul className="list-disc pl-5" data-testid="material-cautions">{materialTexts(material, locale).cautions.map((c) => <li key={c}>{c}</li>)}</ul>
          </div>
        ) : null}
        {visit.statusReason ? <p className="mt-2 text-sm">{t("visit.clinicNote", { note: visit.statusReason })}</p> : null}
      </section>
      <VisitMoney m={m} zone={zone} locale={locale} returned={returned === "returned"}>
        {m.deposit.status === "due" && active ? <PayDepositButton visitId={visit.id} label={t("payments.payDeposit", { amount: money(m.deposit.amountCents, m.deposit.currency, locale) })} /> : null}
        {m.deposit.paidAt ? <p><a className="underline" href={`/api/appointments/${visit.id}/receipt`} download>{t("payments.downloadReceipt")}</a></p> : null}
        {active ? (
          <details className="text-sm">
            <summary className="cursor-pointer font-semibold">{estimate ? t("payments.planChange") : t("payments.planSummaryVisit")}</summary>
            <div className="mt-3">
              <PlanEstimateForm proposalId={visit.proposalId} initial={estimate ? { coveragePercent: String(estimate.coveragePercent), deductibleRemaining: (estimate.deductibleRemainingCents / 100).toFixed(2), annualMaxRemaining: (estimate.annualMaxRemainingCents / 100).toFixed(2), preauthReference: estimate.preauthReference ?? "" } : {}} />
              <p className="mt-2 text-xs text-ink-soft">{t("payments.planCaution")}</p>
            </div>
          </details>
        ) : null}
      </VisitMoney>
      {active ? (
        <section className="space-y-2" aria-labelledby="change">
          <h2 id="change" className="text-lg font-semibold">{t("visit.change")}</h2>
          <VisitActions visitId={visit.id} proposalId={visit.proposalId} materialId={visit.materialId} mode={visit.mode} timezone={zone} canChange={canChange}
            depositNote={depositNote ? t("payments.cancelDeposit", { refundable: depositNote.refundable ? "yes" : "no", amount: money(depositNote.amountCents, depositNote.currency, locale), hours: depositNote.refundHours }) : null}
            cutoffNote={t("visit.cutoff", { hours: cancelCutoffHours, hasPhone: clinic!.phone ? "yes" : "no", phone: clinic!.phone ?? "" })} />
        </section>
      ) : null}
      <ConsentLink user={user} visitId={visit.id} />
      {active ? (
        <ReminderToggle appointmentId={visit.id} enabled={visit.remindersEnabled}
          whenText={reminderHoursBefore.length ? formatList(reminderHoursBefore.map((h) => t("reminders.hoursBefore", { hours: h })), locale) : undefined} />
      ) : null}
      {active ? <PreVisitNotes minutes={minutes} /> : null}
      <section className="card space-y-3" aria-labelledby="plan">
        <h2 id="plan" className="text-lg font-semibold">{t("visit.planned")}</h2>
        <p className="text-sm text-ink-soft">{t("visit.estimate")}</p>
        <VisitTimeline timeline={timeline} />
      </section>
      <CautionsNote />
    </div>
  );
}
