// Visit stage names in French, keyed by the English name lib/domain/timeline.ts gives (the name
// already says milling or grinding, sintering or firing). A name not listed stays in English.
import type { Locale } from "./locale";

const FR: Record<string, string> = {
  "Check-in": "Accueil",
  Anaesthesia: "Anesthésie",
  "Tooth preparation": "Préparation de la dent",
  "Digital impression (scan)": "Empreinte numérique (balayage)",
  "Crown design": "Conception de la couronne",
  Fabrication: "Fabrication",
  Milling: "Usinage",
  Grinding: "Meulage",
  "Heat treatment": "Traitement thermique",
  Sintering: "Frittage",
  "Crystallisation firing": "Cuisson de cristallisation",
  Finishing: "Finition",
  "Stain and glaze": "Maquillage et glaçage",
  Polishing: "Polissage",
  "Try-in": "Essai en bouche",
  Cementation: "Scellement",
  "Aftercare briefing": "Conseils après le traitement",
};

export function stageWords(englishLabel: string, locale: Locale): string {
  return locale === "fr" ? (FR[englishLabel] ?? englishLabel) : englishLabel;
}
