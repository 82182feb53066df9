// The message catalogues, loaded once; shared by pages (next-intl) and by e-mails, the calendar
// file and the PDFs (createTranslator), so every channel speaks from the same words.
import en from "@/messages/en.json";
import fr from "@/messages/fr.json";
import type { Locale } from "./locale";

export type Messages = typeof en;
const CATALOGUES: Record<Locale, Messages> = { en, fr };

export function messagesFor(locale: Locale): Messages {
  return CATALOGUES[locale];
}
