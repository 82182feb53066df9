// A tooth in plain words in the reader's language. English comes from lib/domain/tooth.ts;
// French puts the noun first ("première molaire inférieure gauche"), every name being feminine (une dent).
import { describeTooth, fromFdi } from "@/lib/domain/tooth";
import type { Locale } from "./locale";

const FR_SIDES = ["supérieure droite", "supérieure gauche", "inférieure gauche", "inférieure droite"] as const;
const FR_PERMANENT = ["incisive centrale", "incisive latérale", "canine", "première prémolaire", "deuxième prémolaire", "première molaire", "deuxième molaire", "troisième molaire"];
const FR_PRIMARY = ["incisive centrale", "incisive latérale", "canine", "première molaire", "deuxième molaire"];

/** "lower left first molar" / "première molaire inférieure gauche" */
export function toothWords(fdi: number, locale: Locale): string {
  const t = fromFdi(fdi);
  if (locale === "en") return t.words;
  const name = (t.primary ? FR_PRIMARY : FR_PERMANENT)[t.position - 1];
  return `${name}${t.primary ? " temporaire" : ""} ${FR_SIDES[t.quadrant - 1]}`;
}

/** "36 (Universal 19) — lower left first molar" / "36 (Universel 19) — première molaire inférieure gauche" */
export function toothLabel(fdi: number, locale: Locale): string {
  if (locale === "en") return describeTooth(fdi).label;
  const t = fromFdi(fdi);
  return `${t.fdi} (Universel ${t.universal}) — ${toothWords(fdi, locale)}`;
}
