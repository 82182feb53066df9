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
import { Clinic, Material } from "@/db/models";
import { requirePageUser } from "@/lib/auth/session";
import { getVisitTimeline } from "@/lib/data/visits";
import { findVisitFor, patientMayChange } from "@/lib/booking/transitions";
import { withDefaults } from "@/lib/domain/clinic-settings";
import { describeTooth } from "@/lib/domain/tooth";
import { duration, money, when } from "@/lib/format";
import { formatList } from "@/lib/i18n/format";
import { currentLocale } from "@/lib/i18n/server";
import { toothWords } from "@/lib/i18n/tooth-words";
import { materialName } from "@/lib/i18n/material-texts";
import { AppError } from "@/lib/server/errors";

export async function generateMetadata(): Promise<Metadata> {
  return { title: (await getTranslations("visit"))("title") };
}

export default async function PatientVisitPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser(["patient"]);
  const { id } = await params;
  const visit = await findVisitFor({ user }, id).catch((err) => {
    if (err instanceof AppError && err.status === 404) notFound();
    throw err;
  });
  const [clinic, material, timeline] = await Promise.all([Clinic.findByPk(visit.clinicId), Material.findByPk(visit.materialId), getVisitTimeline({ user, id })]);
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
          <dt className="text-ink-muted">{t("visit.length")}</dt><dd>{t("common.aboutDuration", { duration: duration(minutes, locale) })}</dd>
          <dt className="text-ink-muted">{t("visit.material")}</dt><dd>{material ? materialName(material, locale) : null}</dd>
          <dt className="text-ink-muted">{t("visit.finish")}</dt><dd>{t(`modes.${visit.mode}.name`)}</dd>
          <dt className="text-ink-muted">{t("visit.fee")}</dt><dd>{money(visit.feeCents, clinic!.currency, locale)}</dd>
          <dt className="text-ink-muted">{t("visit.where")}</dt><dd>{clinic!.name}, {clinic!.address}</dd>
        </dl>
        {visit.statusReason ? <p className="mt-2 text-sm">{t("visit.clinicNote", { note: visit.statusReason })}</p> : null}
      </section>
      {active ? (
        <section className="space-y-2" aria-labelledby="change">
          <h2 id="change" className="text-lg font-semibold">{t("visit.change")}</h2>
          <VisitActions visitId={visit.id} proposalId={visit.proposalId} materialId={visit.materialId} mode={visit.mode} timezone={zone} canChange={canChange}
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
