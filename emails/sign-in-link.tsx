import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { emailTranslator, type EmailT } from "@/lib/i18n/email";

export default function SignInLinkEmail({ url, t = emailTranslator("en") }: { url: string; t?: EmailT }) {
  return (
    <EmailLayout t={t} preview={t("signIn.preview")}>
      <Text>{t("signIn.body")}</Text>
      <EmailButton href={url}>{t("signIn.button")}</EmailButton>
      <Text style={{ fontSize: 13 }}>{t("signIn.ignore")}</Text>
    </EmailLayout>
  );
}
