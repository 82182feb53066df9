// Sent after the visit is completed: what is normal with a new crown, and when to call.
import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { BulletList, EmailHeading, Greeting, SmallPrint, type VisitMailProps } from "./parts/visit-details";

export default function AftercareEmail(props: VisitMailProps) {
  const { clinic, patientName, toothWords, visitUrl } = props;
  const phone = clinic.phone ? ` on ${clinic.phone}` : "";
  return (
    <EmailLayout preview="Looking after your new crown" clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>Looking after your new crown</EmailHeading>
      <Greeting name={patientName} />
      <Text>Your new crown on your {toothWords} is in place. Here is what is normal in the next few days.</Text>
      <BulletList
        items={[
          "Numbness: your lip, tongue and cheek may stay numb for a few hours. Until it wears off, avoid hot drinks and chewing, so you do not burn or bite yourself.",
          "Sensitivity: the tooth may be sensitive to hot and cold, and the gum around it sore, for a few days. This usually settles by itself.",
          "Your bite: once the numbness has gone, your teeth should meet as before. If the crown feels high, call us: a small adjustment fixes it.",
          "Cleaning: brush and floss around the crown as usual, from today.",
        ]}
      />
      <Text style={{ fontWeight: 700, margin: "16px 0 4px" }}>Call the clinic{phone} if</Text>
      <BulletList
        items={[
          "pain gets worse instead of better, or keeps you awake, or the area swells",
          "the crown feels loose, comes off, chips or cracks (keep it and bring it with you)",
          "you get a rash, itching or swelling that could be an allergy",
          "bleeding does not stop with gentle pressure",
        ]}
      />
      <Text>If your face swells quickly or you have trouble breathing or swallowing, call emergency services.</Text>
      <EmailButton href={visitUrl}>See your visit</EmailButton>
      <SmallPrint>This is general guidance. Anything your dentist has told you comes first.</SmallPrint>
    </EmailLayout>
  );
}
