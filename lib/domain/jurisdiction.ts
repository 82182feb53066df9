// Where the clinic practises decides which law the agreement to electronic records and the
// privacy wording rest on. Pure data; docs/jurisdictions.md explains the sources.
import type { ConsentLanguage } from "./consent-words";

export type RecordsAgreement = { version: string; heading: string; text: readonly string[] };
export type Jurisdiction = {
  code: string;
  /** For the clinic manager's setting. */
  label: string;
  agreement: Record<ConsentLanguage, RecordsAgreement>;
  /** One sentence on how the clinic keeps health information, for the patient. */
  privacy: Record<ConsentLanguage, string>;
};

// Ontario: the Electronic Commerce Act, 2000 (S.O. 2000, c. 17) lets a record or signature be
// electronic when the person agrees to it, and lets them refuse; PHIPA 2004 governs personal health
// information held by a custodian such as a dentist; PIPEDA Schedule 1, 4.9 gives a right of access.
const ONTARIO: Jurisdiction = {
  code: "CA-ON",
  label: "Ontario, Canada",
  agreement: {
    en: {
      version: "CA-ON-2026-1",
      heading: "Agreement to sign and receive records electronically",
      text: [
        "You agree to sign this consent electronically and to receive it, and other records about this visit, electronically: in the portal and by e-mail. Under Ontario's Electronic Commerce Act, 2000, an electronic signature and record are used only with your agreement.",
        "You have the right to a paper copy at no charge. Ask the clinic at any time.",
        "You can withdraw this agreement at any time by telling the clinic. After that, the clinic gives you records on paper. Withdrawing this agreement does not undo a consent you have already signed.",
        "This agreement covers this consent and the records about this visit.",
        "To open and keep these records you need a device with a web browser, a PDF reader and an e-mail address. You can save or print the PDF copy you receive.",
      ],
    },
    fr: {
      version: "CA-ON-2026-1",
      heading: "Entente pour signer et recevoir des documents par voie électronique",
      text: [
        "Vous acceptez de signer ce consentement par voie électronique et de le recevoir, ainsi que les autres documents concernant ce rendez-vous, par voie électronique : dans le portail et par courriel. En vertu de la Loi de 2000 sur le commerce électronique de l'Ontario, une signature et un document électroniques ne sont utilisés qu'avec votre accord.",
        "Vous avez droit à une copie papier sans frais. Demandez-la à la clinique en tout temps.",
        "Vous pouvez retirer cette entente en tout temps en avisant la clinique. La clinique vous remettra alors vos documents sur papier. Le retrait de cette entente n'annule pas un consentement déjà signé.",
        "Cette entente vise ce consentement et les documents concernant ce rendez-vous.",
        "Pour ouvrir et conserver ces documents, il vous faut un appareil muni d'un navigateur Web, un lecteur PDF et une adresse courriel. Vous pouvez enregistrer ou imprimer la copie PDF que vous recevez.",
      ],
    },
  },
  privacy: {
    en: "The clinic keeps your health information under Ontario's Personal Health Information Protection Act, 2004 (PHIPA). You can ask to see it and to have it corrected.",
    fr: "La clinique conserve vos renseignements sur la santé conformément à la Loi de 2004 sur la protection des renseignements personnels sur la santé (LPRPS) de l'Ontario. Vous pouvez demander à les consulter et à les faire corriger.",
  },
};

// United States: the ESIGN Act, 15 U.S.C. 7001(c), asks for the consumer's affirmative consent after
// telling them of paper copies, withdrawal, scope and the hardware and software needed; the states'
// Uniform Electronic Transactions Act (UETA) gives electronic signatures and records legal effect.
const UNITED_STATES: Jurisdiction = {
  code: "US",
  label: "United States",
  agreement: {
    en: {
      version: "US-2026-1",
      heading: "Agreement to sign and receive records electronically",
      text: [
        "You agree to sign this consent electronically and to receive it, and other records about this visit, electronically: in the portal and by e-mail (as the federal ESIGN Act, 15 U.S.C. 7001(c), requires, this is your choice).",
        "You have the right to a paper copy at no charge. Ask the clinic at any time.",
        "You can withdraw this agreement at any time by telling the clinic. After that, the clinic gives you records on paper. Withdrawing this agreement does not undo a consent you have already signed.",
        "This agreement covers this consent and the records about this visit.",
        "To open and keep these records you need a device with a web browser, a PDF reader and an e-mail address. You can save or print the PDF copy you receive.",
      ],
    },
    fr: {
      version: "US-2026-1",
      heading: "Entente pour signer et recevoir des documents par voie électronique",
      text: [
        "Vous acceptez de signer ce consentement par voie électronique et de le recevoir, ainsi que les autres documents concernant ce rendez-vous, par voie électronique : dans le portail et par courriel (comme l'exige la loi fédérale ESIGN, 15 U.S.C. 7001(c), c'est votre choix).",
        "Vous avez droit à une copie papier sans frais. Demandez-la à la clinique en tout temps.",
        "Vous pouvez retirer cette entente en tout temps en avisant la clinique. La clinique vous remettra alors vos documents sur papier. Le retrait de cette entente n'annule pas un consentement déjà signé.",
        "Cette entente vise ce consentement et les documents concernant ce rendez-vous.",
        "Pour ouvrir et conserver ces documents, il vous faut un appareil muni d'un navigateur Web, un lecteur PDF et une adresse courriel. Vous pouvez enregistrer ou imprimer la copie PDF que vous recevez.",
      ],
    },
  },
  privacy: {
    en: "The clinic keeps your health information as United States federal and state law require. You can ask to see it and to have it corrected.",
    fr: "La clinique conserve vos renseignements sur la santé conformément aux lois fédérales et étatiques des États-Unis. Vous pouvez demander à les consulter et à les faire corriger.",
  },
};

export const JURISDICTIONS: readonly Jurisdiction[] = [ONTARIO, UNITED_STATES];
export const DEFAULT_JURISDICTION = ONTARIO.code;

/** The clinic's jurisdiction; an unknown code falls back to the default (Ontario). */
export function jurisdictionOf(code: string | null | undefined): Jurisdiction {
  return JURISDICTIONS.find((j) => j.code === code) ?? ONTARIO;
}
