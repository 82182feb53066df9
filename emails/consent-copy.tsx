// Carries the patient's copy of their signed consent (the PDF is attached by lib/mail/consent-copy.ts).
import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps, wordsOf, phoneArg } from "./parts/visit-details";

export default function ConsentCopyEmail(props: VisitMailProps & { filename: string }) {
  const { clinic, patientName, visitUrl, filename } = props;
  const t = wordsOf(props);
  return (
    <EmailLayout t={t} preview={t("consentCopy.preview")} clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>{t("consentCopy.heading")}</EmailHeading>
      <Greeting name={patientName} t={t} />
      <Text>{t("consentCopy.body", { filename })}</Text>
      <VisitDetails {...props} />
      <EmailButton href={visitUrl}>{t("seeVisit")}</EmailButton>
      <SmallPrint>{t("consentCopy.small", { phone: phoneArg(clinic.phone) })}</SmallPrint>
    </EmailLayout>
  );
}
