import type { Metadata } from "next";
import { headers } from "next/headers";
import Link from "next/link";
import { notFound } from "next/navigation";
import { CautionsNote } from "@/components/cautions-note";
import { ConsentDocument } from "@/components/consent/consent-document";
import { ConsentStatusChip } from "@/components/consent/consent-status";
import { requirePageUser } from "@/lib/auth/session";
import { openConsentForPatient } from "@/lib/data/consents";
import { when } from "@/lib/format";
import { ConsentFlow } from "./consent-flow";
import { WithdrawConsent } from "./withdraw-consent";
import { clientIpFrom } from "@/lib/server/client-ip";

export const metadata: Metadata = { title: "Consent for your crown" };

export default async function PatientConsentPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser(["patient"]);
  const { id } = await params;
  const h = await headers();
  const view = await openConsentForPatient({
    user,
    appointmentId: id,
    ip: clientIpFrom(h),
    userAgent: h.get("user-agent") ?? "unknown",
  });
  if (!view) notFound();
  const { visit, consent, form } = view;
  const zone = visit.timeZone;
  const latestPdf = view.pdfVersions.at(-1);

  return (
    <div className="mx-auto max-w-read space-y-5">
      <p><Link href={`/patient/visits/${visit.id}`}>← My visit</Link></p>
      <header className="space-y-2">
        <h1 className="text-2xl font-bold">Consent for your crown</h1>
        <p className="text-ink-soft">{visit.tooth} · {visit.material} · {when(visit.startsAt, zone)}</p>
        <ConsentStatusChip status={consent?.status ?? "pending"} />
      </header>

      {view.withdrawn.length > 0 ? (
        <p className="rounded-lg border border-line bg-white p-3 text-sm" data-testid="withdrawn-note">
          You withdrew an earlier consent for this visit on {when(view.withdrawn[0].withdrawnAt, zone)}. It is kept on record.
          {form ? " To go ahead with the crown, please sign again below." : ""}
        </p>
      ) : null}

      {form ? (
        <ConsentFlow
          appointmentId={visit.id}
          templateId={form.templateId}
          textSha256={form.textSha256}
          document={form.document}
          patientName={view.patientName}
        />
      ) : consent && consent.status !== "pending" ? (
        <>
          <section className="card space-y-3" aria-labelledby="signed-heading" data-testid="signed-summary">
            <h2 id="signed-heading" className="text-lg font-semibold">You signed this consent</h2>
            <p>
              Signed by {consent.typedName} on {consent.signedAt ? when(consent.signedAt, zone) : ""}.
              {consent.status === "reviewed" && consent.reviewedAt ? ` Your dentist reviewed it on ${when(consent.reviewedAt, zone)}.` : " Your dentist will go through it with you in the chair before starting."}
            </p>
            <p>We e-mailed you a copy. You can also ask the clinic for a paper copy at any time.</p>
            {latestPdf ? (
              <a className="btn-quiet" href={`/api/consents/${consent.id}/pdf`} data-testid="consent-pdf-link">
                Open your signed consent (PDF)
              </a>
            ) : null}
          </section>
          {view.signedDocument ? (
            <details className="card">
              <summary className="cursor-pointer font-semibold">Read what you signed</summary>
              <div className="mt-3"><ConsentDocument doc={view.signedDocument} /></div>
            </details>
          ) : null}
          {view.canWithdraw ? <WithdrawConsent consentId={consent.id} /> : null}
        </>
      ) : (
        <p className="card">This visit can no longer be signed for. If you have questions, please contact the clinic.</p>
      )}
      <CautionsNote />
    </div>
  );
}
