// A file size in the reader's language ("1.5 MB", "1,5 Mo"); works in server and client components.
import { useLocale, useTranslations } from "next-intl";
import { sizeParts } from "@/lib/domain/documents";
import { INTL_TAG, isLocale } from "@/lib/i18n/locale";

export function useSizeWords(): (bytes: number) => string {
  const t = useTranslations("documentList");
  const locale = useLocale();
  const tag = INTL_TAG[isLocale(locale) ? locale : "en"];
  return (bytes) => {
    const { unit, n, decimals } = sizeParts(bytes);
    return t(unit, { n: new Intl.NumberFormat(tag, { minimumFractionDigits: decimals, maximumFractionDigits: decimals, useGrouping: false }).format(n) });
  };
}
