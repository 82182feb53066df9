import type { Metadata } from "next";
import { headers } from "next/headers";
import Link from "next/link";
import { getTranslations } from "next-intl/server";
import { notFound } from "next/navigation";
import { CautionsNote } from "@/components/cautions-note";
import { ConsentDocument } from "@/components/consent/consent-document";
import { ConsentStatusChip } from "@/components/consent/consent-status";
import { requirePageUser } from "@/lib/auth/session";
import { openConsentForPatient } from "@/lib/data/consents";
import { when } from "@/lib/format";
import { currentLocale } from "@/lib/i18n/server";
import { ConsentFlow } from "./consent-flow";
import { WithdrawConsent } from "./withdraw-consent";
import { clientIpFrom } from "@/lib/server/client-ip";

export async function generateMetadata(): Promise<Metadata> {
  return { title: (await getTranslations("consent"))("title") };
}

export default async function PatientConsentPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser(["patient"]);
  const { id } = await params;
  const h = await headers();
  const locale = await currentLocale();
  const t = await getTranslations("consent");
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
      <p><Link href={`/patient/visits/${visit.id}`}>{t("backVisit")}</Link></p>
      <header className="space-y-2">
        <h1 className="text-2xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{visit.tooth} · {visit.material} · {when(visit.startsAt, zone, locale)}</p>
        <ConsentStatusChip status={consent?.status ?? "pending"} />
      </header>

      {view.withdrawn.length > 0 ? (
        <p className="rounded-lg border border-line bg-white p-3 text-sm" data-testid="withdrawn-note">
          {t("withdrawnNote", { date: when(view.withdrawn[0].withdrawnAt, zone, locale) })}
          {form ? ` ${t("signAgain")}` : ""}
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
            <h2 id="signed-heading" className="text-lg font-semibold">{t("youSigned")}</h2>
            <p>
              {t("signedBy", { name: consent.typedName ?? "", date: consent.signedAt ? when(consent.signedAt, zone, locale) : "" })}
              {consent.status === "reviewed" && consent.reviewedAt ? ` ${t("reviewedOn", { date: when(consent.reviewedAt, zone, locale) })}` : ` ${t("willReview")}`}
            </p>
            <p>{t("copySent")}</p>
            {latestPdf ? (
              <a className="btn-quiet" href={`/api/consents/${consent.id}/pdf`} data-testid="consent-pdf-link">
                {t("openPdf")}
              </a>
            ) : null}
          </section>
          {view.signedDocument ? (
            <details className="card">
              <summary className="cursor-pointer font-semibold">{t("readSigned")}</summary>
              <div className="mt-3"><ConsentDocument doc={view.signedDocument} /></div>
            </details>
          ) : null}
          {view.canWithdraw ? <WithdrawConsent consentId={consent.id} /> : null}
        </>
      ) : (
        <p className="card">{t("closed")}</p>
      )}
      <p className="text-sm text-ink-soft" data-testid="privacy-note">{view.privacy}</p>
      <CautionsNote />
    </div>
  );
}
