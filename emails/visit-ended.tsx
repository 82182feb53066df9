// Sent when reception declines a request or a visit is cancelled (by the patient or the clinic).
import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps } from "./parts/visit-details";

export default function VisitEndedEmail(props: VisitMailProps & { outcome: "declined" | "cancelled"; reason: string | null; hasCalendar: boolean }) {
  const { clinic, patientName, visitUrl, outcome, reason, hasCalendar } = props;
  const declined = outcome === "declined";
  return (
    <EmailLayout
      preview={declined ? "The clinic could not confirm your requested time" : "Your crown visit is cancelled"}
      clinicName={clinic.name}
      clinicAddress={clinic.address}
      clinicPhone={clinic.phone}
    >
      <EmailHeading>{declined ? "Your requested time could not be confirmed" : "Your crown visit is cancelled"}</EmailHeading>
      <Greeting name={patientName} />
      <Text>
        {declined
          ? "The clinic could not confirm the visit you asked for, so that time is not booked."
          : "The visit below is cancelled and the time is no longer held for you."}
      </Text>
      {reason ? <Text>Reason given: {reason}</Text> : null}
      <VisitDetails {...props} />
      {hasCalendar ? <Text>The attached calendar file (crown-visit.ics) marks the visit as cancelled in your calendar.</Text> : null}
      <Text>Your crown proposal stays open: you can choose another time in the portal whenever you are ready.</Text>
      <EmailButton href={visitUrl}>Choose another time</EmailButton>
      <SmallPrint>Questions? Call the clinic{clinic.phone ? ` on ${clinic.phone}` : ""}.</SmallPrint>
    </EmailLayout>
  );
}
