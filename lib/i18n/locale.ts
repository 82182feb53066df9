// The languages the patient side speaks, and the choice among them from a browser's
// Accept-Language header (RFC 9110 §12.5.4: comma-separated ranges with optional q weights).
export const LOCALES = ["en", "fr"] as const;
export type Locale = (typeof LOCALES)[number];
export const DEFAULT_LOCALE: Locale = "en";
/** The cookie that keeps a signed-out visitor's choice. */
export const LOCALE_COOKIE = "cuspal-locale";

export const LOCALE_NAMES: Record<Locale, string> = { en: "English", fr: "Français" };
/** For the staff side, which stays in English: "French". */
export const LOCALE_ENGLISH_NAMES: Record<string, string> = { en: "English", fr: "French" };

/** Regional tag for Intl formatting: the clinic is Canadian by default, so Canadian usage. */
export const INTL_TAG: Record<Locale, string> = { en: "en-CA", fr: "fr-CA" };

export function isLocale(value: unknown): value is Locale {
  return typeof value === "string" && (LOCALES as readonly string[]).includes(value);
}

/** The best supported language for an Accept-Language header, or null when none fits. */
export function localeFromAcceptLanguage(header: string | null | undefined): Locale | null {
  if (!header) return null;
  const ranges = header
    .split(",")
    .map((part, index) => {
      const [tag, ...params] = part.trim().split(";");
      const q = params.map((p) => p.trim()).find((p) => p.startsWith("q="));
      const weight = q ? Number(q.slice(2)) : 1;
      return { tag: tag.trim().toLowerCase(), weight: Number.isFinite(weight) ? weight : 0, index };
    })
    .filter((r) => r.tag && r.weight > 0)
    .sort((a, b) => b.weight - a.weight || a.index - b.index);
  for (const r of ranges) {
    const primary = r.tag.split("-")[0];
    if (isLocale(primary)) return primary;
  }
  return null;
}
