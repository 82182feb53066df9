import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps, wordsOf } from "./parts/visit-details";

export default function VisitRequestedEmail(props: VisitMailProps) {
  const { clinic, patientName, visitUrl } = props;
  const t = wordsOf(props);
  return (
    <EmailLayout t={t} preview={t("requested.preview")} clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>{t("requested.heading")}</EmailHeading>
      <Greeting name={patientName} t={t} />
      <Text>{t("requested.body")}</Text>
      <VisitDetails {...props} />
      <EmailButton href={visitUrl}>{t("seeVisit")}</EmailButton>
      <SmallPrint>{t("requested.small")}</SmallPrint>
    </EmailLayout>
  );
}
