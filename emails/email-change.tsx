import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";

/** Sent to a new address a patient gave: the change takes effect only when this link is followed. */
export default function EmailChangeEmail({ url, hours }: { url: string; hours: number }) {
  return (
    <EmailLayout preview="Confirm your new e-mail address for Cuspal">
      <Text>You asked to use this e-mail address for your Cuspal account. Tap the button to confirm it.</Text>
      <EmailButton href={url}>Use this address</EmailButton>
      <Text style={{ fontSize: 13 }}>The link works once and expires in {hours} hours. Until then, your clinic keeps writing to your old address.</Text>
      <Text style={{ fontSize: 13 }}>If you did not ask for this, ignore this e-mail; nothing changes.</Text>
    </EmailLayout>
  );
}
