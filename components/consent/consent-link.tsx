import Link from "next/link";
import { getTranslations } from "next-intl/server";
import type { SessionUser } from "@/lib/auth/session";
import { consentStatusForVisit } from "@/lib/data/consents";
import { ConsentStatusChip } from "./consent-status";

/** A visit page's consent section: its status and the way to sign (patient) or review (staff). */
export async function ConsentLink({ user, visitId }: { user: SessionUser; visitId: string }) {
  const consent = await consentStatusForVisit({ user, appointmentId: visitId });
  if (!consent) return null;
  const patient = user.role === "patient";
  const t = await getTranslations("consent");
  const href = patient ? `/patient/visits/${visitId}/consent` : `/clinic/consents/${visitId}`;
  const label = patient
    ? consent.status === "pending" ? t("readAndSign") : t("seeSigned")
    : consent.status === "signed" ? "Review the consent" : "Open the consent";
  if (patient && consent.status === "pending" && !consent.open) return null;
  return (
    <section className="card space-y-2" aria-labelledby="consent-heading" data-testid="visit-consent">
      <h2 id="consent-heading" className="text-lg font-semibold">{t("section")}</h2>
      <ConsentStatusChip status={consent.status} />
      {patient && consent.status === "pending" ? (
        <p>{t("pendingNote")}</p>
      ) : null}
      {!patient && consent.flags > 0 ? <p className="text-sm">{consent.flags === 1 ? "1 health point" : `${consent.flags} health points`} flagged for the dentist.</p> : null}
      {/* No prefetch: opening the consent page is recorded in its audit trail. */}
      <Link href={href} prefetch={false} className={patient && consent.status === "pending" ? "btn-primary" : "btn-quiet"}>{label}</Link>
    </section>
  );
}
