// The visit summary every visit e-mail shows (when, where, which tooth, which material, how long),
// and the props those templates share.
import { Heading, Section, Text } from "@react-email/components";
import type { ReactNode } from "react";
import type { VisitWhen } from "@/lib/domain/visit-when";
import { emailTranslator, type EmailT } from "@/lib/i18n/email";
import { colours } from "./layout";

export type VisitMailProps = {
  clinic: { name: string; address: string; phone: string | null };
  patientName: string;
  when: VisitWhen;
  toothWords: string;
  materialName: string;
  /** "2 hours 30 minutes" */
  lengthWords: string;
  /** The patient's own page for this visit in the portal. */
  visitUrl: string;
  /** The patient's language; English when not given. */
  t?: EmailT;
};

/** The translator a template speaks through. */
export function wordsOf(props: { t?: EmailT }): EmailT {
  return props.t ?? emailTranslator("en");
}

/** The clinic's phone for an ICU select: "none" when there is none. */
export function phoneArg(phone: string | null): string {
  return phone ?? "none";
}

const label = { fontSize: 12, color: colours.muted, margin: "8px 0 0", textTransform: "uppercase" as const, letterSpacing: 0.5 };
const value = { fontSize: 15, margin: "2px 0 0" };

export function EmailHeading({ children }: { children: ReactNode }) {
  return <Heading as="h1" style={{ fontSize: 22, lineHeight: "28px", margin: "0 0 12px", color: colours.ink }}>{children}</Heading>;
}

export function Greeting({ name, t = emailTranslator("en") }: { name: string; t?: EmailT }) {
  return <Text style={{ margin: "0 0 12px" }}>{name ? t("hello", { name }) : t("helloAnonymous")}</Text>;
}

export function VisitDetails(props: VisitMailProps) {
  const { when, clinic, toothWords, materialName, lengthWords } = props;
  const t = wordsOf(props);
  return (
    <Section style={{ backgroundColor: colours.paper, borderRadius: 8, padding: "8px 16px 12px", margin: "12px 0" }}>
      <Text style={label}>{t("when")}</Text>
      <Text style={value}>
        {t("whenValue", { date: when.date, start: when.start, end: when.end, zone: when.zoneName })}
      </Text>
      <Text style={label}>{t("where")}</Text>
      <Text style={value}>{clinic.name}, {clinic.address}</Text>
      <Text style={label}>{t("crown")}</Text>
      <Text style={value}>{t("crownValue", { tooth: toothWords, material: materialName })}</Text>
      <Text style={label}>{t("allow")}</Text>
      <Text style={value}>{t("allowValue", { length: lengthWords })}</Text>
    </Section>
  );
}

export function SmallPrint({ children }: { children: ReactNode }) {
  return <Text style={{ fontSize: 13, color: colours.muted }}>{children}</Text>;
}

export function BulletList({ items }: { items: ReactNode[] }) {
  return (
    <Section style={{ margin: "4px 0 8px" }}>
      {items.map((item, i) => (
        <Text key={i} style={{ margin: "4px 0", paddingLeft: 14, textIndent: -14 }}>
          • {item}
        </Text>
      ))}
    </Section>
  );
}
