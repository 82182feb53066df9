// Sent when reception declines a request or a visit is cancelled (by the patient or the clinic).
import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps, wordsOf, phoneArg } from "./parts/visit-details";

export default function VisitEndedEmail(props: VisitMailProps & { outcome: "declined" | "cancelled"; reason: string | null; hasCalendar: boolean }) {
  const { clinic, patientName, visitUrl, outcome, reason, hasCalendar } = props;
  const declined = outcome === "declined";
  const t = wordsOf(props);
  return (
    <EmailLayout
      t={t}
      preview={declined ? t("ended.previewDeclined") : t("ended.previewCancelled")}
      clinicName={clinic.name}
      clinicAddress={clinic.address}
      clinicPhone={clinic.phone}
    >
      <EmailHeading>{declined ? t("ended.headingDeclined") : t("ended.headingCancelled")}</EmailHeading>
      <Greeting name={patientName} t={t} />
      <Text>{declined ? t("ended.bodyDeclined") : t("ended.bodyCancelled")}</Text>
      {reason ? <Text>{t("ended.reason", { reason })}</Text> : null}
      <VisitDetails {...props} />
      {hasCalendar ? <Text>{t("ended.calendar")}</Text> : null}
      <Text>{t("ended.open")}</Text>
      <EmailButton href={visitUrl}>{t("ended.choose")}</EmailButton>
      <SmallPrint>{t("ended.small", { phone: phoneArg(clinic.phone) })}</SmallPrint>
    </EmailLayout>
  );
}
