import { useLocale, useTranslations } from "next-intl";
import { visitLengthRange } from "@/lib/domain/timeline";
import { isLocale } from "@/lib/i18n/locale";

/** What a patient should know before a long single visit ([C] common practice, no source). */
export function PreVisitNotes({ minutes }: { minutes: number }) {
  const t = useTranslations("preVisit");
  const current = useLocale();
  const locale = isLocale(current) ? current : "en";
  return (
    <section className="card" aria-labelledby="before">
      <h2 id="before" className="text-lg font-semibold">{t("title")}</h2>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-ink-soft">
        <li>{t("wholeVisit", { duration: visitLengthRange(minutes, minutes, locale).text })}</li>
        <li>{t("meal")}</li>
        <li>{t("medicines")}</li>
        <li>{t("unwell")}</li>
      </ul>
    </section>
  );
}
