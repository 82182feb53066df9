import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { CautionsNote } from "@/components/cautions-note";
import { ConsentStatusChip } from "@/components/consent/consent-status";
import { FlagList } from "@/components/consent/flag-list";
import { StatusBadge } from "@/components/visits/status-badge";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { staffConsentView } from "@/lib/data/consents";
import { when } from "@/lib/format";
import { WITHDRAWAL_CHANNEL_LABEL } from "@/lib/domain/consent-withdrawal";
import { localDate, localTime } from "@/lib/domain/time-zone";
import { RecordWithdrawal } from "./record-withdrawal";
import { ReviewButton } from "./review-button";
import { LOCALE_ENGLISH_NAMES } from "@/lib/i18n/locale";

export const metadata: Metadata = { title: "Consent review" };

/** One visit's consent for the dentist chairside: flags first, the sealed PDF, and the review. */
export default async function ConsentReviewPage({ params }: { params: Promise<{ visitId: string }> }) {
  const user = await requirePageUser(STAFF_ROLES);
  const { visitId } = await params;
  const view = await staffConsentView({ user, appointmentId: visitId });
  if (!view) notFound();
  const { visit, consent } = view;
  const zone = visit.timeZone;
  const signed = consent && consent.status !== "pending" ? consent : null;

  return (
    <div className="space-y-5">
      <p><Link href="/clinic/consents">← Consents today</Link></p>
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1 className="text-2xl font-bold">{visit.patient}</h1>
          <p className="text-ink-soft">{visit.tooth} · {visit.material} · {when(visit.startsAt, zone)}</p>
          <p className="text-sm"><Link href={`/clinic/visits/${visit.id}`}>Open the visit</Link></p>
        </div>
        <span className="flex flex-wrap gap-2">
          <StatusBadge status={visit.status} />
          <ConsentStatusChip status={consent?.status ?? "pending"} />
        </span>
      </header>

      {!signed ? (
        <section className="card space-y-2">
          <h2 className="text-lg font-semibold">Not signed yet</h2>
          <p>The patient has not signed the consent for this visit. They can sign on their phone from their visit page; treatment cannot start before the consent is signed and reviewed.</p>
        </section>
      ) : (
        <div className="grid gap-5 lg:grid-cols-[minmax(0,22rem)_1fr]">
          <div className="space-y-5">
            <section className="card space-y-3" aria-labelledby="flags-heading">
              <h2 id="flags-heading" className="text-lg font-semibold">Health points to check</h2>
              <FlagList flags={signed.flags} />
            </section>
            <section className="card space-y-3" aria-labelledby="review-heading">
              <h2 id="review-heading" className="text-lg font-semibold">Chairside review</h2>
              <p className="text-sm">
                Signed by {signed.typedName} on {signed.signedAt ? when(signed.signedAt, zone) : ""} (consent text version {signed.templateVersion}).
              </p>
              <p className="text-sm" data-testid="signed-language">
                Signed in <strong>{LOCALE_ENGLISH_NAMES[signed.language] ?? signed.language}</strong>: the patient read, signed and was sent the {LOCALE_ENGLISH_NAMES[signed.language] ?? signed.language} text.
              </p>
              {signed.status === "reviewed" ? (
                <p className="font-medium text-sage-700" data-testid="reviewed-note">
                  Reviewed by {signed.reviewer} on {signed.reviewedAt ? when(signed.reviewedAt, zone) : ""}.
                </p>
              ) : view.canReview ? (
                <ReviewButton consentId={signed.id} />
              ) : (
                <p className="text-sm text-ink-soft">Waiting for the dentist&apos;s chairside review.</p>
              )}
            </section>
            <details className="card">
              <summary className="cursor-pointer font-semibold">All answers</summary>
              <dl className="mt-3 space-y-2 text-sm">
                {signed.answers.map((a) => (
                  <div key={a.question}>
                    <dt className="text-ink-soft">{a.question}</dt>
                    <dd className="font-semibold">{a.answer}</dd>
                  </div>
                ))}
              </dl>
            </details>
          </div>
          <section className="space-y-3" aria-labelledby="pdf-heading">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <h2 id="pdf-heading" className="text-lg font-semibold">Sealed PDF</h2>
              <a className="btn-quiet" href={`/api/consents/${signed.id}/pdf`} target="_blank" rel="noopener">Open the PDF full screen</a>
            </div>
            <iframe
              title={`Signed consent of ${visit.patient}`}
              src={`/api/consents/${signed.id}/pdf`}
              className="h-[36rem] w-full rounded-card border border-line bg-white"
              data-testid="consent-pdf-frame"
            />
            <ul className="space-y-1 text-sm" aria-label="PDF versions">
              {view.pdfVersions.map((p) => (
                <li key={p.version}>
                  <a className="underline" href={`/api/consents/${signed.id}/pdf?version=${p.version}`}>
                    Version {p.version} ({p.reason === "signed" ? "as signed" : "with the review"})
                  </a>{" "}
                  <span className="break-all text-ink-muted">SHA-256 {p.sha256}</span>
                </li>
              ))}
            </ul>
          </section>
        </div>
      )}

      {signed && ["requested", "confirmed", "checked_in"].includes(visit.status) ? (
        <details className="card" data-testid="record-withdrawal">
          <summary className="cursor-pointer font-semibold">The patient withdrew consent by phone, in person or in writing</summary>
          <p className="mt-2 text-sm text-ink-soft">Record it here for them. The consent is kept on record as withdrawn, and treatment cannot start until a new consent is signed and reviewed.</p>
          <div className="mt-3"><RecordWithdrawal consentId={signed.id} today={localDate(new Date(), zone)} nowTime={localTime(new Date(), zone).slice(0, 5)} /></div>
        </details>
      ) : null}
      {view.withdrawn.length ? (
        <section className="card space-y-2" aria-labelledby="withdrawn-heading">
          <h2 id="withdrawn-heading" className="text-lg font-semibold">Withdrawn earlier</h2>
          <ul className="space-y-1 text-sm">
            {view.withdrawn.map((w) => (
              <li key={w.id}>
                Signed {w.signedAt ? when(w.signedAt, zone) : ""}, withdrawn {when(w.withdrawnAt, zone)}
                {w.via ? ` ${WITHDRAWAL_CHANNEL_LABEL[w.via as keyof typeof WITHDRAWAL_CHANNEL_LABEL]}` : ""}{w.byName ? ` by ${w.byName}` : ""}{w.reason ? `: “${w.reason}”` : ""}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      <CautionsNote />
    </div>
  );
}
