import { Text } from "@react-email/components";
import { emailTranslator, type EmailT } from "@/lib/i18n/email";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";

/** Sent to a new address a patient gave: the change takes effect only when this link is followed. */
export default function EmailChangeEmail({ url, hours, t = emailTranslator("en") }: { url: string; hours: number; t?: EmailT }) {
  return (
    <EmailLayout t={t} preview={t("emailChange.preview")}>
      <Text>{t("emailChange.body")}</Text>
      <EmailButton href={url}>{t("emailChange.button")}</EmailButton>
      <Text style={{ fontSize: 13 }}>{t("emailChange.expiry", { hours })}</Text>
      <Text style={{ fontSize: 13 }}>{t("emailChange.ignore")}</Text>
    </EmailLayout>
  );
}
