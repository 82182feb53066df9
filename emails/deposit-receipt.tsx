import { Section, Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps } from "./parts/visit-details";

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
  const paid = kind === "paid";
  return (
    <EmailLayout preview={paid ? `Receipt: deposit of ${amountText} received` : `Receipt: deposit of ${amountText} refunded`} clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>{paid ? "We received your deposit" : "Your deposit was refunded"}</EmailHeading>
      <Greeting name={patientName} />
      <Text>
        {paid
          ? `Thank you. ${clinic.name} received your deposit of ${amountText} for the crown visit below. It counts toward the fee.`
          : `${clinic.name} refunded your deposit of ${amountText} in full. Your card company may take a few business days to show it.`}
      </Text>
      <Section>
        <Text style={{ margin: "4px 0" }}>Amount: {amountText}</Text>
        <Text style={{ margin: "4px 0" }}>{paid ? "Paid" : "Refunded"}: {atText}</Text>
        <Text style={{ margin: "4px 0" }}>Receipt number: {receiptNumber}</Text>
      </Section>
      <VisitDetails {...props} />
      <EmailButton href={visitUrl}>See your visit and download the receipt</EmailButton>
      <SmallPrint>Keep this e-mail for your records. A dental-plan estimate shown in the portal is only an estimate: your plan&apos;s own decision prevails.</SmallPrint>
    </EmailLayout>
  );
}
