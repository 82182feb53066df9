import { Text } from "@react-email/components";
import type { VisitWhen } from "@/lib/domain/visit-when";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps } from "./parts/visit-details";

export default function VisitMovedEmail(props: VisitMailProps & { previous: VisitWhen | null; hasCalendar: boolean }) {
  const { clinic, patientName, visitUrl, previous, hasCalendar } = props;
  return (
    <EmailLayout preview={`New time: ${props.when.date} at ${props.when.start}`} clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>Your crown visit has a new time</EmailHeading>
      <Greeting name={patientName} />
      {previous ? (
        <Text>
          It was on {previous.date} at {previous.start} ({previous.zoneName}). This is the new time:
        </Text>
      ) : (
        <Text>This is the new time:</Text>
      )}
      <VisitDetails {...props} />
      {hasCalendar ? <Text>The attached calendar file (crown-visit.ics) replaces the old entry in your calendar.</Text> : null}
      <EmailButton href={visitUrl}>See your visit</EmailButton>
      <SmallPrint>If the new time does not suit you, call the clinic{clinic.phone ? ` on ${clinic.phone}` : ""} or use your visit page.</SmallPrint>
    </EmailLayout>
  );
}
