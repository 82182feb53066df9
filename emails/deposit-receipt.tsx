import { Section, Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps, wordsOf } from "./parts/visit-details";

export type DepositReceiptProps = VisitMailProps & {
  kind: "paid" | "refunded";
  /** Already formatted with Intl.NumberFormat, e.g. "$200.00". */
  amountText: string;
  atText: string;
  receiptNumber: string;
};

/** A receipt for a deposit paid through the payment page, or for its refund. */
export default function DepositReceiptEmail(props: DepositReceiptProps) {
  const { clinic, patientName, visitUrl, kind, amountText, atText, receiptNumber } = props;
  const t = wordsOf(props);
  const args = { amount: amountText, clinic: clinic.name };
  return (
    <EmailLayout t={t} preview={t(`deposit.preview.${kind}`, args)} clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>{t(`deposit.heading.${kind}`)}</EmailHeading>
      <Greeting name={patientName} t={t} />
      <Text>{t(`deposit.body.${kind}`, args)}</Text>
      <Section>
        <Text style={{ margin: "4px 0" }}>{t("deposit.amount", { amount: amountText })}</Text>
        <Text style={{ margin: "4px 0" }}>{t(`deposit.at.${kind}`, { at: atText })}</Text>
        <Text style={{ margin: "4px 0" }}>{t("deposit.number", { number: receiptNumber })}</Text>
      </Section>
      <VisitDetails {...props} />
      <EmailButton href={visitUrl}>{t("deposit.button")}</EmailButton>
      <SmallPrint>{t("deposit.small")}</SmallPrint>
    </EmailLayout>
  );
}
