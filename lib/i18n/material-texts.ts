// A material's patient-facing texts in the reader's language; English when no translation is kept.
import type { MaterialTexts, MaterialTranslations } from "@/db/models/material";
import type { Locale } from "./locale";

export function materialTexts(m: MaterialTexts & { translations?: MaterialTranslations | null }, locale: Locale): MaterialTexts {
  const tr = locale === "en" ? undefined : m.translations?.[locale];
  if (tr && tr.description.trim()) return { description: tr.description, pros: tr.pros, cautions: tr.cautions };
  return { description: m.description, pros: m.pros, cautions: m.cautions };
}

/** The material's generic name in the reader's language ("zircone"), else its English name. */
export function materialName(m: { name: string; translations?: MaterialTranslations | null }, locale: Locale): string {
  return (locale === "en" ? undefined : m.translations?.[locale]?.name?.trim()) || m.name;
}
