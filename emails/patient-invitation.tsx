import { Text } from "@react-email/components";
import { emailTranslator, type EmailT } from "@/lib/i18n/email";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";

export type PatientInvitationProps = {
  url: string; patientName: string; clinicName: string; clinicAddress?: string; clinicPhone?: string | null; hours: number;
  /** The patient's registered language; English when not given. */
  t?: EmailT;
};

/** The clinic's invitation to a newly registered patient: one link that signs them in. */
export default function PatientInvitationEmail({ url, patientName, clinicName, clinicAddress, clinicPhone, hours, t = emailTranslator("en") }: PatientInvitationProps) {
  return (
    <EmailLayout t={t} preview={t("invitation.preview", { clinic: clinicName })} clinicName={clinicName} clinicAddress={clinicAddress} clinicPhone={clinicPhone}>
      <Text>{t("hello", { name: patientName })}</Text>
      <Text>{t("invitation.body", { clinic: clinicName })}</Text>
      <EmailButton href={url}>{t("invitation.button")}</EmailButton>
      <Text style={{ fontSize: 13 }}>{t("invitation.expiry", { hours })}</Text>
      <Text style={{ fontSize: 13 }}>{t("invitation.ignore")}</Text>
    </EmailLayout>
  );
}
