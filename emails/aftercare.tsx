// Sent after the visit is completed: what is normal with a new crown, and when to call.
import { Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { EmailLayout } from "./parts/layout";
import { BulletList, EmailHeading, Greeting, SmallPrint, type VisitMailProps, wordsOf, phoneArg } from "./parts/visit-details";

export default function AftercareEmail(props: VisitMailProps) {
  const { clinic, patientName, toothWords, visitUrl } = props;
  const t = wordsOf(props);
  const phone = phoneArg(clinic.phone);
  return (
    <EmailLayout t={t} preview={t("aftercare.preview")} clinicName={clinic.name} clinicAddress={clinic.address} clinicPhone={clinic.phone}>
      <EmailHeading>{t("aftercare.heading")}</EmailHeading>
      <Greeting name={patientName} t={t} />
      <Text>{t("aftercare.intro", { tooth: toothWords })}</Text>
      <BulletList
        items={[
          t("aftercare.numb"),
          t("aftercare.sensitive"),
          t("aftercare.bite"),
          t("aftercare.clean"),
        ]}
      />
      <Text style={{ fontWeight: 700, margin: "16px 0 4px" }}>{t("aftercare.callIf", { phone })}</Text>
      <BulletList
        items={[
          t("aftercare.pain"),
          t("aftercare.loose"),
          t("aftercare.allergy"),
          t("aftercare.bleeding"),
        ]}
      />
      <Text>{t("aftercare.emergency")}</Text>
      <EmailButton href={visitUrl}>{t("seeVisit")}</EmailButton>
      <SmallPrint>{t("aftercare.small")}</SmallPrint>
    </EmailLayout>
  );
}
