// The reminder before a visit, with the instructions that matter for a long, single crown visit.
import { Link, Text } from "@react-email/components";
import { EmailButton } from "./parts/button";
import { colours, EmailLayout } from "./parts/layout";
import { BulletList, EmailHeading, Greeting, SmallPrint, VisitDetails, type VisitMailProps, wordsOf, phoneArg } from "./parts/visit-details";

export default function ReminderEmail(props: VisitMailProps & { leadText: string; turnOffUrl: string }) {
  const { clinic, patientName, visitUrl, lengthWords, leadText, turnOffUrl } = props;
  const t = wordsOf(props);
  const phone = phoneArg(clinic.phone);
  return (
    <EmailLayout
      t={t}
      preview={t("reminder.preview", { lead: leadText, date: props.when.date, start: props.when.start })}
      clinicName={clinic.name}
      clinicAddress={clinic.address}
      clinicPhone={clinic.phone}
      footer={
        <Text style={{ fontSize: 12, color: colours.muted }}>
          {t("reminder.footer")}{" "}
          <Link href={turnOffUrl} style={{ color: colours.accent }}>{t("reminder.turnOff")}</Link>
          {t("reminder.footerAfter")}
        </Text>
      }
    >
      <EmailHeading>{t("reminder.heading", { lead: leadText })}</EmailHeading>
      <Greeting name={patientName} t={t} />
      <VisitDetails {...props} />
      <Text style={{ fontWeight: 700, margin: "16px 0 4px" }}>{t("reminder.before")}</Text>
      <BulletList
        items={[
          t("reminder.meal"),
          t("reminder.numb"),
          t("reminder.allow", { length: lengthWords }),
          t("reminder.medicines"),
          t("reminder.unwell", { phone }),
        ]}
      />
      <Text>{t("reminder.calendar")}</Text>
      <EmailButton href={visitUrl}>{t("seeVisit")}</EmailButton>
      <SmallPrint>{t("reminder.small")}</SmallPrint>
    </EmailLayout>
  );
}
