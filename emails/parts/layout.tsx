// Shared frame for every Cuspal e-mail: header, body, footer with the cautions line.
import { Body, Container, Head, Hr, Html, Preview, Section, Text } from "@react-email/components";
import type { ReactNode } from "react";
import { emailTranslator, type EmailT } from "@/lib/i18n/email";

export const colours = { ink: "#1f2a37", muted: "#55606e", accent: "#0d6e6e", paper: "#f7f5f0", card: "#ffffff" };

export function EmailLayout({ preview, clinicName = "Cuspal", clinicAddress, clinicPhone, footer, children, t = emailTranslator("en") }: {
  preview: string;
  clinicName?: string;
  clinicAddress?: string;
  clinicPhone?: string | null;
  /** Extra small print under the address, e.g. how to turn reminders off. */
  footer?: ReactNode;
  children: ReactNode;
  /** The patient's language (English when not given). */
  t?: EmailT;
}) {
  return (
    <Html lang={t("lang")}>
      <Head />
      <Preview>{preview}</Preview>
      <Body style={{ backgroundColor: colours.paper, color: colours.ink, fontFamily: "Helvetica, Arial, sans-serif", margin: 0 }}>
        <Container style={{ maxWidth: 560, margin: "0 auto", padding: "24px 16px" }}>
          <Text style={{ fontSize: 18, fontWeight: 700, color: colours.accent, margin: "0 0 12px" }}>{clinicName}</Text>
          <Section style={{ backgroundColor: colours.card, borderRadius: 12, padding: "20px 24px" }}>{children}</Section>
          <Hr style={{ borderColor: "#ddd8cc", margin: "24px 0 12px" }} />
          {clinicAddress ? <Text style={{ fontSize: 12, color: colours.muted, margin: 0 }}>{clinicName}, {clinicAddress}</Text> : null}
          {clinicPhone ? <Text style={{ fontSize: 12, color: colours.muted, margin: 0 }}>{t("phone", { phone: clinicPhone })}</Text> : null}
          {footer}
          <Text style={{ fontSize: 12, color: colours.muted }}>
            {t("footer")}
          </Text>
        </Container>
      </Body>
    </Html>
  );
}
