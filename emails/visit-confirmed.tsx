import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps, wordsOf, phoneArg } from "./parts/visit-details";

export default function VisitConfirmedEmail(props: VisitMailProps & { reminderText: string | null }) {
  const { clinic, patientName, visitUrl, reminderText } = props;
  const t = wordsOf(props);
  return (
    <EmailLayout t={t} preview={t("confirmed.preview", { date: props.when.date, start: props.when.start })} clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>{t("confirmed.heading")}</EmailHeading>
      <Greeting name={patientName} t={t} />
      <Text>{t("confirmed.body")}</Text>
      <VisitDetails {...props} />
      <Text>{t("confirmed.calendar")}</Text>
      {reminderText ? <Text>{t("confirmed.reminder", { when: reminderText })}</Text> : null}
      <EmailButton href={visitUrl}>{t("seeVisit")}</EmailButton>
      <SmallPrint>{t("confirmed.small", { phone: phoneArg(clinic.phone) })}</SmallPrint>
    </EmailLayout>
  );
}
