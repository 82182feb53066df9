// The reminder before a visit, with the instructions that matter for a long, single crown visit.
import { Link, Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { colours, EmailLayout } from "./parts/layout";
import { BulletList, EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps } from "./parts/visit-details";

export default function ReminderEmail(props: VisitMailProps & { leadText: string; turnOffUrl: string }) {
  const { clinic, patientName, visitUrl, lengthWords, leadText, turnOffUrl } = props;
  const phone = clinic.phone ? ` on ${clinic.phone}` : "";
  return (
    <EmailLayout
      preview={`Your crown visit is ${leadText}: ${props.when.date} at ${props.when.start}`}
      clinicName={clinic.name}
      clinicAddress={clinic.address}
      clinicPhone={clinic.phone}
      footer={
        <Text style={{ fontSize: 12, color: colours.muted }}>
          You get this because reminders are on for this visit.{" "}
          <Link href={turnOffUrl} style={{ color: colours.accent }}>Turn off reminders for this visit</Link>
          . You can turn them back on from your visit page.
        </Text>
      }
    >
      <EmailHeading>Your crown visit is {leadText}</EmailHeading>
      <Greeting name={patientName} />
      <VisitDetails {...props} />
      <Text style={{ fontWeight: 700, margin: "16px 0 4px" }}>Before you come</Text>
      <BulletList
        items={[
          "Eat a normal meal beforehand. Your mouth will probably be numb for a few hours afterwards, which makes eating awkward.",
          "Expect numbness: the local anaesthetic usually wears off within a few hours. Plan an easy time afterwards.",
          `Allow the whole visit: about ${lengthWords} in the chair, while your crown is designed and made. Plan to arrive a few minutes early to check in.`,
          "Bring a list of the medicines you take (including blood thinners and supplements), and tell us about any change in your health.",
          `If you feel unwell (fever, cold or flu, a new health problem) or cannot come, call the clinic${phone} before the visit, and we will find another time.`,
        ]}
      />
      <Text>A calendar file is attached (crown-visit.ics) in case the visit is not in your calendar yet.</Text>
      <EmailButton href={visitUrl}>See your visit</EmailButton>
      <SmallPrint>These are general instructions. Anything your dentist has told you comes first.</SmallPrint>
    </EmailLayout>
  );
}
