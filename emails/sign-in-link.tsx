import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";

export default function SignInLinkEmail({ url }: { url: string }) {
  return (
    <EmailLayout preview="Your link to sign in to Cuspal">
      <Text>Tap the button to sign in to your crown visit portal. The link works once and expires in 30 minutes.</Text>
      <EmailButton href={url}>Sign in to Cuspal</EmailButton>
      <Text style={{ fontSize: 13 }}>If you did not ask for this link, ignore this e-mail; nobody can sign in without it.</Text>
    </EmailLayout>
  );
}
