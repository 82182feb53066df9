// Carries the patient's copy of their signed consent (the PDF is attached by lib/mail/consent-copy.ts).
import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps } from "./parts/visit-details";

export default function ConsentCopyEmail(props: VisitMailProps & { filename: string }) {
  const { clinic, patientName, visitUrl, filename } = props;
  return (
    <EmailLayout preview="Your copy of the consent you signed" clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>Your copy of your signed consent</EmailHeading>
      <Greeting name={patientName} />
      <Text>
        Attached is a copy of the consent you signed for your crown visit ({filename}). Please keep it. The clinic keeps the
        original, and your dentist will go through it with you again in the chair before starting.
      </Text>
      <VisitDetails {...props} />
      <EmailButton href={visitUrl}>See your visit</EmailButton>
      <SmallPrint>
        You can ask for a paper copy at any time. If something in it is wrong, or you want to withdraw your consent, contact
        the clinic{clinic.phone ? ` on ${clinic.phone}` : ""}.
      </SmallPrint>
    </EmailLayout>
  );
}
