// The fixed words of a consent's canonical text (headings of the visit block, the version line)
// and of its visit rows, in each language a consent can be signed in. Pure data.
export const CONSENT_LANGUAGES = ["en", "fr"] as const;
export type ConsentLanguage = (typeof CONSENT_LANGUAGES)[number];

export type ConsentWords = {
  visitHeading: string;
  versionPrefix: string;
  /** The records agreement heading's suffix: "(version 2026-1)". */
  recordsVersion: (version: string) => string;
  recordsVersionRe: RegExp;
  rows: { patient: string; dateOfBirth: string; tooth: string; material: string; materialClass: (name: string, cls: number) => string; mode: string; visit: string; length: string; dentist: string; clinic: string };
  /** The wording that depends on whether the material is a final or a provisional crown. */
  crown: { final: string; provisional: string };
  visits: { final: string; provisional: string };
  noCautions: string;
  yourDentist: string;
  modes: Record<string, string>;
  languageName: string;
};

export const CONSENT_WORDS: Record<ConsentLanguage, ConsentWords> = {
  en: {
    visitHeading: "Your visit",
    versionPrefix: "Consent text version ",
    recordsVersion: (v) => `(version ${v})`,
    recordsVersionRe: /^(.*) \(version ([^)]+)\)$/,
    rows: {
      patient: "Patient", dateOfBirth: "Date of birth", tooth: "Tooth (ISO 3950)", material: "Material",
      materialClass: (name, cls) => `${name} (ISO 6872 class ${cls})`, mode: "Finishing mode", visit: "Visit", length: "Expected length", dentist: "Dentist", clinic: "Clinic",
    },
    crown: { final: "a crown", provisional: "a provisional (temporary) crown" },
    visits: {
      final: "Everything happens in one visit: no temporary crown and no second appointment for fitting.",
      provisional: "It is made and fitted in one visit. It is a provisional crown: it protects the tooth for a limited time, and a final crown is still needed at a later appointment.",
    },
    noCautions: "Your dentist will explain this material's cautions chairside.",
    yourDentist: "your dentist",
    modes: { rapid: "rapid", standard: "standard", refined: "refined" },
    languageName: "English",
  },
  fr: {
    visitHeading: "Votre rendez-vous",
    versionPrefix: "Texte de consentement, version ",
    recordsVersion: (v) => `(version ${v})`,
    recordsVersionRe: /^(.*) \(version ([^)]+)\)$/,
    rows: {
      patient: "Patient(e)", dateOfBirth: "Date de naissance", tooth: "Dent (ISO 3950)", material: "Matériau",
      materialClass: (name, cls) => `${name} (ISO 6872, classe ${cls})`, mode: "Finition", visit: "Rendez-vous", length: "Durée prévue", dentist: "Dentiste", clinic: "Clinique",
    },
    crown: { final: "une couronne", provisional: "une couronne provisoire (temporaire)" },
    visits: {
      final: "Tout se fait en un seul rendez-vous : pas de couronne temporaire ni de deuxième rendez-vous pour la pose.",
      provisional: "Elle est fabriquée et posée en un seul rendez-vous. C'est une couronne provisoire : elle protège la dent pendant un temps limité, et une couronne définitive reste nécessaire lors d'un rendez-vous ultérieur.",
    },
    noCautions: "Votre dentiste vous expliquera au fauteuil les mises en garde propres à ce matériau.",
    yourDentist: "votre dentiste",
    modes: { rapid: "rapide", standard: "standard", refined: "raffinée" },
    languageName: "Français",
  },
};

export function isConsentLanguage(value: unknown): value is ConsentLanguage {
  return typeof value === "string" && (CONSENT_LANGUAGES as readonly string[]).includes(value);
}
