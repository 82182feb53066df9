// The slot picker's words from the "slots" messages: `slotWords` with any translator (the server's
// getTranslations or a client hook), `useSlotWords` inside a message provider.
import { useLocale, useTranslations } from "next-intl";
import { isLocale, type Locale } from "@/lib/i18n/locale";
import type { SlotWords } from "./slot-picker";

type Translate = (key: string, values?: Record<string, string>) => string;

export function slotWords(t: Translate, timezone: string): SlotWords {
  return {
    zoneNote: t("zoneNote", { zone: timezone.replace("_", " ") }),
    loading: t("loading"), error: t("error"), none: t("none"), days: t("days"), later: t("later"),
    // Formatted with a literal "{day}", which the picker replaces with the chosen day.
    times: t("times", { day: "{day}" }),
  };
}

/** For client components that already sit inside a message provider (the visit and request screens). */
export function useSlotWords(timezone: string): { words: SlotWords; locale: Locale } {
  const t = useTranslations("slots");
  const current = useLocale();
  return { words: slotWords(t as unknown as Translate, timezone), locale: isLocale(current) ? current : "en" };
}
