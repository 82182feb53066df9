import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";

export type PatientInvitationProps = { url: string; patientName: string; clinicName: string; clinicAddress?: string; clinicPhone?: string | null; hours: number };

/** The clinic's invitation to a newly registered patient: one link that signs them in. */
export default function PatientInvitationEmail({ url, patientName, clinicName, clinicAddress, clinicPhone, hours }: PatientInvitationProps) {
  return (
    <EmailLayout preview={`${clinicName} invites you to your crown visit portal`} clinicName={clinicName} clinicAddress={clinicAddress} clinicPhone={clinicPhone}>
      <Text>Hello {patientName},</Text>
      <Text>
        {clinicName} has opened a Cuspal account for you. There you can see the crowns your dentist proposes, choose a visit time,
        read and sign your consent, and keep your documents.
      </Text>
      <EmailButton href={url}>Open my Cuspal account</EmailButton>
      <Text style={{ fontSize: 13 }}>
        The button signs you in once and stops working after {hours} hours. Later, ask for a new sign-in link on the sign-in page with this e-mail address.
      </Text>
      <Text style={{ fontSize: 13 }}>If you do not know this clinic, ignore this e-mail; nobody can use the account without the link.</Text>
    </EmailLayout>
  );
}
