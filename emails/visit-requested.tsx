import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps } from "./parts/visit-details";

export default function VisitRequestedEmail(props: VisitMailProps) {
  const { clinic, patientName, visitUrl } = props;
  return (
    <EmailLayout preview="Your crown visit request is with the clinic" clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>Your visit request is with the clinic</EmailHeading>
      <Greeting name={patientName} />
      <Text>
        Thank you. Reception will check the time you asked for and confirm it, or get in touch about another time. Nothing is
        booked until you receive the confirmation e-mail.
      </Text>
      <VisitDetails {...props} />
      <EmailButton href={visitUrl}>See your visit</EmailButton>
      <SmallPrint>You can cancel the request from your visit page at any time before it is confirmed.</SmallPrint>
    </EmailLayout>
  );
}
