import { Text } from "@react-email/components";
import type { VisitWhen } from "@/lib/domain/visit-when";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps, wordsOf, phoneArg } from "./parts/visit-details";

export default function VisitMovedEmail(props: VisitMailProps & { previous: VisitWhen | null; hasCalendar: boolean }) {
  const { clinic, patientName, visitUrl, previous, hasCalendar } = props;
  const t = wordsOf(props);
  return (
    <EmailLayout t={t} preview={t("moved.preview", { date: props.when.date, start: props.when.start })} clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>{t("moved.heading")}</EmailHeading>
      <Greeting name={patientName} t={t} />
      {previous ? (
        <Text>{t("moved.was", { date: previous.date, start: previous.start, zone: previous.zoneName })}</Text>
      ) : (
        <Text>{t("moved.newTime")}</Text>
      )}
      <VisitDetails {...props} />
      {hasCalendar ? <Text>{t("moved.calendar")}</Text> : null}
      <EmailButton href={visitUrl}>{t("seeVisit")}</EmailButton>
      <SmallPrint>{t("moved.small", { phone: phoneArg(clinic.phone) })}</SmallPrint>
    </EmailLayout>
  );
}
