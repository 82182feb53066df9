import type { Metadata } from "next";
import Link from "next/link";
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
import { PLAN_CAUTION, VisitMoney } from "@/components/payments/visit-money";
import { requirePageUser } from "@/lib/auth/session";
import { getVisitMoney } from "@/lib/data/payments";
import { getVisitPage, getVisitTimeline } from "@/lib/data/visits";
import { cancellationDepositNote } from "@/lib/payments/deposits";
import { patientMayChange } from "@/lib/booking/transitions";
import { withDefaults } from "@/lib/domain/clinic-settings";
import { visitLengthRange } from "@/lib/domain/timeline";
import { describeTooth } from "@/lib/domain/tooth";
import { MODE_WORDS, money, when } from "@/lib/format";
import { AppError } from "@/lib/server/errors";

export const metadata: Metadata = { title: "My visit" };

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

  return (
    <div className="mx-auto max-w-read space-y-5">
      <p><Link href="/patient">← My crown</Link></p>
      <header className="space-y-1">
        <p className="text-sm font-semibold text-harbour-700">Tooth {tooth.fdi} · Universal {tooth.universal}</p>
        <h1 className="text-2xl font-bold first-letter:uppercase">{tooth.words}</h1>
        <StatusBadge status={visit.status} />
      </header>
      <section className="card" aria-labelledby="summary">
        <h2 id="summary" className="sr-only">Summary</h2>
        <dl className="grid grid-cols-[6.5rem_1fr] gap-y-1">
          <dt className="text-ink-muted">Starts</dt><dd data-testid="visit-start">{when(visit.startsAt, zone)}</dd>
          <dt className="text-ink-muted">Length</dt><dd data-testid="visit-length">{visitLengthRange(minutes).text} (our estimate for your tooth and material)</dd>
          <dt className="text-ink-muted">Material</dt><dd>{material?.name}</dd>
          <dt className="text-ink-muted">Finish</dt><dd>{MODE_WORDS[visit.mode].name}</dd>
          <dt className="text-ink-muted">Where</dt><dd>{clinic!.name}, {clinic!.address}</dd>
        </dl>
        {material?.provisionalOnly ? <p className="mt-2 text-sm font-semibold text-clay-700">This is a provisional (temporary) crown: a final crown is still needed later.</p> : null}
        {material?.cautions.length ? (
          <div className="mt-2 text-sm">
            <p className="font-semibold">Cautions for {material.name}</p>
            <ul className="list-disc pl-5" data-testid="material-cautions">{material.cautions.map((c) => <li key={c}>{c}</li>)}</ul>
          </div>
        ) : null}
        {visit.statusReason ? <p className="mt-2 text-sm">Note from the clinic: {visit.statusReason}</p> : null}
      </section>
      <VisitMoney m={m} zone={zone} returned={returned === "returned"}>
        {m.deposit.status === "due" && active ? <PayDepositButton visitId={visit.id} label={`Pay the ${money(m.deposit.amountCents, m.deposit.currency)} deposit`} /> : null}
        {m.deposit.paidAt ? <p><a className="underline" href={`/api/appointments/${visit.id}/receipt`} download>Download the receipt (PDF)</a></p> : null}
        {active ? (
          <details className="text-sm">
            <summary className="cursor-pointer font-semibold">{estimate ? "Change your dental-plan figures" : "Have a dental plan? Estimate your share"}</summary>
            <div className="mt-3">
              <PlanEstimateForm proposalId={visit.proposalId} initial={estimate ? { coveragePercent: String(estimate.coveragePercent), deductibleRemaining: (estimate.deductibleRemainingCents / 100).toFixed(2), annualMaxRemaining: (estimate.annualMaxRemainingCents / 100).toFixed(2), preauthReference: estimate.preauthReference ?? "" } : {}} />
              <p className="mt-2 text-xs text-ink-soft">{PLAN_CAUTION}</p>
            </div>
          </details>
        ) : null}
      </VisitMoney>
      {active ? (
        <section className="space-y-2" aria-labelledby="change">
          <h2 id="change" className="text-lg font-semibold">Change this visit</h2>
          <VisitActions visitId={visit.id} proposalId={visit.proposalId} materialId={visit.materialId} mode={visit.mode} timezone={zone} canChange={canChange}
            depositNote={depositNote ? (depositNote.refundable ? `Your ${money(depositNote.amountCents, depositNote.currency)} deposit will be refunded in full.` : `Your ${money(depositNote.amountCents, depositNote.currency)} deposit will not be refunded: the clinic refunds it only up to ${depositNote.refundHours} hours before the visit.`) : null}
            cutoffNote={`Changes online are possible until ${cancelCutoffHours} hours before the visit; after that, please call the clinic${clinic!.phone ? ` on ${clinic!.phone}` : ""}.`} />
        </section>
      ) : null}
      <ConsentLink user={user} visitId={visit.id} />
      {active ? (
        <ReminderToggle appointmentId={visit.id} enabled={visit.remindersEnabled}
          whenText={reminderHoursBefore.length ? `${reminderHoursBefore.map((h) => `${h} hours`).join(" and ")} before` : "before your visit"} />
      ) : null}
      {active ? <PreVisitNotes minutes={minutes} /> : null}
      <section className="card space-y-3" aria-labelledby="plan">
        <h2 id="plan" className="text-lg font-semibold">How the visit is planned</h2>
        <p className="text-sm text-ink-soft">An estimate: your dentist may adjust it on the day.</p>
        <VisitTimeline timeline={timeline} />
      </section>
      <CautionsNote />
    </div>
  );
}
