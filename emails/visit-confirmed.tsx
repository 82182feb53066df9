import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps } from "./parts/visit-details";

export default function VisitConfirmedEmail(props: VisitMailProps & { reminderText: string | null }) {
  const { clinic, patientName, visitUrl, reminderText } = props;
  return (
    <EmailLayout preview={`Confirmed: ${props.when.date} at ${props.when.start}`} clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>Your crown visit is confirmed</EmailHeading>
      <Greeting name={patientName} />
      <Text>
        The time below is held for you: a chair, your dentist and the machine that makes your crown are reserved for the whole
        visit, and you leave with the finished crown.
      </Text>
      <VisitDetails {...props} />
      <Text>A calendar file is attached (crown-visit.ics): open it to add the visit to your calendar.</Text>
      {reminderText ? <Text>We will send you a reminder {reminderText}, with a few things to do before the visit.</Text> : null}
      <EmailButton href={visitUrl}>See your visit</EmailButton>
      <SmallPrint>Need another time? Use your visit page or call the clinic{clinic.phone ? ` on ${clinic.phone}` : ""}.</SmallPrint>
    </EmailLayout>
  );
}
