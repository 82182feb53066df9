// Two buttons, each named in its own language, so a reader finds theirs whatever is shown now.
// A server component: the words come from here, only the small button group runs in the browser.
import { getLocale, getTranslations } from "next-intl/server";
import { isLocale } from "@/lib/i18n/locale";
import { LanguageButtons } from "./language-buttons";

export async function LanguageSwitcher() {
  const t = await getTranslations("language");
  const current = await getLocale();
  return <LanguageButtons current={isLocale(current) ? current : "en"} label={t("label")} failed={t("failed")} />;
}
