import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { DeliveryLog } from "@/components/clinic/delivery-log";
import { ConsentLink } from "@/components/consent/consent-link";
import { DeskActions } from "@/components/payments/desk-actions";
import { PayDepositButton } from "@/components/payments/pay-deposit-button";
import { VisitMoney } from "@/components/payments/visit-money";
import { StatusBadge } from "@/components/visits/status-badge";
import { VisitTimeline } from "@/components/visits/visit-timeline";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { getVisitMoney } from "@/lib/data/payments";
import { getVisitPage, getVisitTimeline } from "@/lib/data/visits";
import { describeTooth } from "@/lib/domain/tooth";
import { duration, MODE_WORDS, when } from "@/lib/format";
import { AppError } from "@/lib/server/errors";
import { VisitBlocks } from "./visit-blocks";
import { VisitProgress } from "./visit-progress";

export const metadata: Metadata = { title: "Visit" };

export default async function ClinicVisitPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser(STAFF_ROLES);
  const { id } = await params;
  const { visit, clinic, material, patient } = await getVisitPage({ user, id }).catch((err) => {
    if (err instanceof AppError && err.status === 404) notFound();
    throw err;
  });
  const [timeline, { money: m }] = await Promise.all([getVisitTimeline({ user, id }), getVisitMoney({ user }, id)]);
  const reception = ["reception", "admin"].includes(user.role);
  const zone = clinic!.timeZone;
  const tooth = describeTooth(visit.tooth);
  return (
    <div className="space-y-5">
      <p><Link href="/clinic">← Clinic</Link></p>
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1 className="text-2xl font-bold">{patient?.user?.name} · tooth {tooth.fdi}</h1>
          <p className="text-ink-soft">{tooth.label}</p>
        </div>
        <StatusBadge status={visit.status} />
      </header>
      <section className="card" aria-labelledby="details">
        <h2 id="details" className="text-lg font-semibold">Details</h2>
        <dl className="mt-2 grid grid-cols-[7rem_1fr] gap-y-1 text-sm sm:grid-cols-[9rem_1fr]">
          <dt className="text-ink-muted">Starts</dt><dd>{when(visit.startsAt, zone)}</dd>
          <dt className="text-ink-muted">Length</dt><dd>{duration(Math.round((visit.endsAt.getTime() - visit.startsAt.getTime()) / 60_000))}</dd>
          <dt className="text-ink-muted">Material</dt><dd>{material?.name} · {MODE_WORDS[visit.mode].name}</dd>
          <dt className="text-ink-muted">Patient e-mail</dt><dd>{patient?.user?.email}</dd>
          {visit.statusReason ? (<><dt className="text-ink-muted">Reason</dt><dd>{visit.statusReason}</dd></>) : null}
        </dl>
      </section>
      <VisitMoney m={m} zone={zone}>
        {m.deposit.paidAt ? <p className="text-sm"><a className="underline" href={`/api/appointments/${visit.id}/receipt`} download>Deposit receipt (PDF)</a></p> : null}
        {reception && m.deposit.status === "due" && visit.status === "requested" ? <PayDepositButton visitId={visit.id} label="Take the deposit now (card at the desk)" /> : null}
        {reception && !["declined", "cancelled", "no_show"].includes(visit.status) ? <DeskActions visitId={visit.id} canWaive={m.deposit.status === "due"} suggestedAmount={m.balanceDueCents ? (m.balanceDueCents / 100).toFixed(2) : ""} /> : null}
      </VisitMoney>
      <ConsentLink user={user} visitId={visit.id} />
      <section className="card space-y-3" aria-labelledby="timeline">
        <h2 id="timeline" className="text-lg font-semibold">Planned timeline</h2>
        <VisitTimeline timeline={timeline} />
      </section>
      {["confirmed", "checked_in", "in_progress", "completed"].includes(visit.status) ? (
        <section className="card space-y-3" aria-labelledby="progress">
          <h2 id="progress" className="text-lg font-semibold">Progress</h2>
          <VisitProgress visitId={visit.id} canMark={["dentist", "reception"].includes(user.role)} />
        </section>
      ) : null}
      <DeliveryLog appointmentId={visit.id} />
      <section className="card space-y-3" aria-labelledby="blocks">
        <h2 id="blocks" className="text-lg font-semibold">Crown block</h2>
        <VisitBlocks visitId={visit.id} clinicId={visit.clinicId} zone={zone} canRecord={["dentist", "reception"].includes(user.role)} open={["confirmed", "checked_in", "in_progress", "completed"].includes(visit.status)} />
      </section>
    </div>
  );
}
