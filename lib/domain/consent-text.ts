// Consent text: the sections a template holds, the default plain-language template, and the
// assembly of one visit's consent (placeholders filled in, the material's cautions added) into
// the exact text the patient reads, signs and whose SHA-256 is stored, in the patient's language
// (the French default template is in consent-text-fr.ts, the fixed words in consent-words.ts). Pure functions.
import { CONSENT_LANGUAGES, CONSENT_WORDS, type ConsentLanguage } from "./consent-words";

export const SECTION_KEYS = ["procedure", "benefits", "risks", "material", "alternatives", "costs", "questions"] as const;
export type SectionKey = (typeof SECTION_KEYS)[number];

export type TemplateSection = { key: SectionKey; heading: string; body: string };

/** What each section is for, shown to the clinic manager beside the editor. */
export const SECTION_PURPOSE: Record<SectionKey, string> = {
  procedure: "What will be done",
  benefits: "Benefits",
  risks: "Risks",
  material: "Material cautions (the chosen material's cautions are added below this text)",
  alternatives: "Alternatives, including no treatment and a laboratory-made crown over two visits",
  costs: "Costs",
  questions: "Questions for the dentist",
};

export const PLACEHOLDERS = ["patient", "tooth", "material", "mode", "date", "fee", "clinic", "dentist", "length", "crown", "visits"] as const;
export type Placeholder = (typeof PLACEHOLDERS)[number];
export type VisitFacts = Record<Placeholder, string>;

export const PLACEHOLDER_HELP: Record<Placeholder, string> = {
  patient: "the patient's name",
  tooth: "the tooth, in ISO 3950 and plain words",
  material: "the chosen material",
  mode: "the finishing mode",
  date: "the visit's date and time",
  fee: "the fee",
  clinic: "the clinic's name",
  dentist: "the dentist's name",
  length: "the visit's expected length, a rounded range from the estimate for this tooth, material and mode",
  crown: "\"a crown\", or \"a provisional (temporary) crown\" for a provisional material",
  visits: "one sentence on what one visit covers: no temporary crown, or for a provisional material that a final crown is still needed",
};

/** The wording that depends on whether the material is a final or a provisional crown. */
export function crownWording(provisional: boolean, language: ConsentLanguage = "en"): Pick<VisitFacts, "crown" | "visits"> {
  const w = CONSENT_WORDS[language];
  const kind = provisional ? "provisional" : "final";
  return { crown: w.crown[kind], visits: w.visits[kind] };
}

export const DEFAULT_TEMPLATE_TITLE = "Consent to a same-day crown";

// Risks and alternatives follow docs/clinical-references.md and docs/references.md: [C] crown consent risks (common practice);
// [P] ADA Code 1.A (reasonable alternatives) and UK GDC Standards 3.1 (options, risks, benefits,
// costs, consequences of no treatment).
export const DEFAULT_SECTIONS: TemplateSection[] = [
  {
    key: "procedure",
    heading: "What will be done",
    body: [
      "Your dentist, {dentist}, proposes {crown} for your tooth {tooth}. A crown is a cap that covers the whole visible part of the tooth. Yours will be made of {material} ({mode} finish) during one visit on {date} at {clinic}.",
      "During the visit the dentist numbs the tooth with a local anaesthetic injection, removes decay and old filling material, and shapes the tooth so the crown fits over it. A camera scans the tooth instead of a putty mould. The crown is designed on a screen and cut from a solid block by a milling machine in the clinic. Some materials are then heated in a furnace to reach their full strength. The dentist tries the crown in, adjusts your bite and fixes it in place with dental cement.",
      "By our estimate for your tooth, material and finish, the visit takes {length}. It can run longer on the day. You can rest or leave the chair while the crown is being made.",
    ].join("\n\n"),
  },
  {
    key: "benefits",
    heading: "Why a crown may help",
    body: [
      "- It protects what is left of a weakened or cracked tooth from breaking.",
      "- It lets you chew normally on that side again.",
      "- It restores the tooth's shape and colour.",
      "- {visits}",
    ].join("\n"),
  },
  {
    key: "risks",
    heading: "Risks",
    body: [
      "Most crowns go well, but any crown carries some risks. Please read them carefully.",
      [
        "- Shaping the tooth removes some healthy tooth structure, and this cannot be undone.",
        "- The local anaesthetic numbs your lip, tongue or cheek for a few hours. Rarely, numbness or tingling lasts longer.",
        "- The tooth may be sensitive to hot and cold for a few days or weeks.",
        "- The nerve inside the tooth may become inflamed, even months later. The tooth may then need root canal treatment or, rarely, removal.",
        "- A crown can chip or break.",
        "- A crown can come loose and need to be fixed again.",
        "- Your bite may need small adjustments after the visit.",
        "- The gum around the crown may be sore or irritated for a while.",
        "- Rarely, people react to a material or cement used (an allergy).",
        "- Crowns do not last forever. Many last ten years or more with good care and check-ups.",
      ].join("\n"),
    ].join("\n\n"),
  },
  {
    key: "material",
    heading: "About your material: {material}",
    body: "Your dentist has checked that {material} suits your tooth. Every material has trade-offs. These are the cautions for {material}:",
  },
  {
    key: "alternatives",
    heading: "Other choices, including no treatment",
    body: [
      "You do not have to have this crown. Your other choices are:",
      [
        "- A crown made in a dental laboratory over two visits: at the first visit the tooth is shaped and a temporary crown is fitted; at the second visit, usually one to three weeks later, the finished crown is fixed in place.",
        "- A different crown material, where your dentist offered more than one.",
        "- A large filling or a partial crown (an onlay), if enough of the tooth is left. It may not protect a cracked tooth as well.",
        "- Removing the tooth, and then possibly replacing it with an implant, a bridge or a denture, or leaving a gap.",
        "- No treatment for now. The tooth may crack further, hurt or become infected, and may later need root canal treatment or removal. Ask your dentist how likely this is for your tooth.",
      ].join("\n"),
    ].join("\n\n"),
  },
  {
    key: "costs",
    heading: "Costs",
    body: [
      "The fee for this crown is {fee}. It covers the visit, the crown and its fitting.",
      "If the tooth needs further treatment, for example root canal treatment, that is charged separately and the dentist will discuss it with you first. Ask the clinic if you want to check what your insurance covers.",
    ].join("\n\n"),
  },
  {
    key: "questions",
    heading: "Your questions",
    body: [
      "You can ask your dentist anything about this treatment before you sign, and again at the clinic before treatment starts. Your dentist will go through this consent with you chairside.",
      "You can change your mind at any time before treatment starts, even after signing: withdraw your consent in the portal or tell the clinic.",
    ].join("\n\n"),
  },
];

/** The agreement to electronic records, shown before signing ([P] ESIGN Act, 15 U.S.C. 7001(c)). */
export const ELECTRONIC_RECORDS = {
  version: "2026-1",
  heading: "Agreement to sign and receive records electronically",
  text: [
    "You agree to sign this consent electronically and to receive it, and other records about this visit, electronically: in the portal and by e-mail.",
    "You have the right to a paper copy at no charge. Ask the clinic at any time.",
    "You can withdraw this agreement at any time by telling the clinic. After that, the clinic gives you records on paper. Withdrawing this agreement does not undo a consent you have already signed.",
    "This agreement covers this consent and the records about this visit.",
    "To open and keep these records you need a device with a web browser, a PDF reader and an e-mail address. You can save or print the PDF copy you receive.",
  ],
} as const;

export type Block = { kind: "p"; text: string } | { kind: "list"; items: string[] };
export type AssembledSection = { key: SectionKey; heading: string; blocks: Block[] };
export type VisitRow = { label: string; value: string };
export type AssembledConsent = {
  /** The language the text is written in (its fixed words follow it). */
  language: ConsentLanguage;
  title: string;
  templateVersion: number;
  /** The visit as the patient saw it: patient, tooth, material, mode, date, dentist, clinic. */
  visit: VisitRow[];
  sections: AssembledSection[];
  electronicRecords: { version: string; heading: string; text: readonly string[] };
};

const PLACEHOLDER_RE = /\{([a-zA-Z]+)\}/g;

export function fillPlaceholders(text: string, facts: VisitFacts): string {
  return text.replace(PLACEHOLDER_RE, (whole, name: string) =>
    (PLACEHOLDERS as readonly string[]).includes(name) ? facts[name as Placeholder] : whole,
  );
}

const oneLine = (text: string) => text.replace(/\s+/g, " ").trim();

/** Paragraphs are separated by blank lines; a block whose lines all start with "- " is a list. */
export function parseBlocks(body: string): Block[] {
  return body
    .replace(/\r\n?/g, "\n")
    .split(/\n\s*\n/)
    .map((chunk) => chunk.trim())
    .filter(Boolean)
    .map((chunk): Block => {
      const lines = chunk.split("\n").map((l) => l.trim()).filter(Boolean);
      if (lines.every((l) => l.startsWith("- "))) return { kind: "list", items: lines.map((l) => oneLine(l.slice(2))) };
      return { kind: "p", text: oneLine(lines.join(" ")) };
    });
}

export type VisitSummary = VisitFacts & { materialClass: number | null; dateOfBirth: string | null };

/** The "Your visit" rows, in a fixed order. */
export function visitRows(facts: VisitSummary, language: ConsentLanguage = "en"): VisitRow[] {
  const w = CONSENT_WORDS[language].rows;
  const rows: VisitRow[] = [{ label: w.patient, value: facts.patient }];
  if (facts.dateOfBirth) rows.push({ label: w.dateOfBirth, value: facts.dateOfBirth });
  rows.push(
    { label: w.tooth, value: facts.tooth },
    { label: w.material, value: facts.materialClass ? w.materialClass(facts.material, facts.materialClass) : facts.material },
    { label: w.mode, value: facts.mode },
    { label: w.visit, value: facts.date },
    { label: w.length, value: facts.length },
    { label: w.dentist, value: facts.dentist },
    { label: w.clinic, value: facts.clinic },
  );
  return rows.map((r) => ({ label: r.label, value: oneLine(r.value) }));
}

/** One visit's consent: the template's sections with the visit filled in and the material's cautions added. */
export function assembleConsent(input: {
  title: string;
  templateVersion: number;
  sections: TemplateSection[];
  facts: VisitSummary;
  materialCautions: readonly string[];
  /** The language of title, sections and cautions; English when not given. */
  language?: ConsentLanguage;
  /** The records agreement of the clinic's jurisdiction, in that language. */
  electronicRecords?: { version: string; heading: string; text: readonly string[] };
}): AssembledConsent {
  const language = input.language ?? "en";
  const byKey = new Map(input.sections.map((s) => [s.key, s]));
  const sections = SECTION_KEYS.map((key): AssembledSection => {
    const section = byKey.get(key);
    if (!section) throw new Error(`The consent template has no "${key}" section.`);
    const blocks = parseBlocks(fillPlaceholders(section.body, input.facts));
    if (key === "material") {
      const cautions = input.materialCautions.map(oneLine).filter(Boolean);
      blocks.push(cautions.length ? { kind: "list", items: cautions } : { kind: "p", text: CONSENT_WORDS[language].noCautions });
    }
    return { key, heading: oneLine(fillPlaceholders(section.heading, input.facts)), blocks };
  });
  return {
    language,
    title: oneLine(fillPlaceholders(input.title, input.facts)),
    templateVersion: input.templateVersion,
    visit: visitRows(input.facts, language),
    sections,
    electronicRecords: input.electronicRecords ?? ELECTRONIC_RECORDS,
  };
}


/**
 * The canonical text of an assembled consent: exactly what the patient was shown, in a fixed
 * plain-text layout ("# " title, "## " headings, "- " list items, blank lines between blocks),
 * Unicode NFC. Its SHA-256 is stored with the signature, and parseConsentText reads it back,
 * so every PDF of a consent is laid out from the very text that was signed.
 */
export function consentText(doc: AssembledConsent): string {
  const words = CONSENT_WORDS[doc.language];
  const parts: string[] = [`# ${doc.title}`, `${words.versionPrefix}${doc.templateVersion}`];
  parts.push(`## ${words.visitHeading}`, doc.visit.map((r) => `- ${r.label}: ${r.value}`).join("\n"));
  for (const s of doc.sections) {
    parts.push(`## ${s.heading}`);
    for (const b of s.blocks) parts.push(b.kind === "p" ? b.text : b.items.map((i) => `- ${i}`).join("\n"));
  }
  parts.push(`## ${doc.electronicRecords.heading} ${words.recordsVersion(doc.electronicRecords.version)}`);
  parts.push(...doc.electronicRecords.text);
  return parts.join("\n\n").normalize("NFC") + "\n";
}

/** Reads a canonical consent text back into its parts (the inverse of consentText). */
export function parseConsentText(text: string): AssembledConsent {
  const chunks = text.replace(/\n$/, "").split("\n\n");
  const [titleLine, versionLine, ...rest] = chunks;
  // The version line names the language: each language has its own fixed words.
  const language = CONSENT_LANGUAGES.find((l) => versionLine?.startsWith(CONSENT_WORDS[l].versionPrefix));
  if (!titleLine?.startsWith("# ") || !language) throw new Error("Not a consent text: the title or version line is missing.");
  const groups: { heading: string; chunks: string[] }[] = [];
  for (const chunk of rest) {
    if (chunk.startsWith("## ")) groups.push({ heading: chunk.slice(3), chunks: [] });
    else if (groups.length) groups[groups.length - 1].chunks.push(chunk);
    else throw new Error("Not a consent text: text before the first heading.");
  }
  const visitGroup = groups.shift();
  const recordsGroup = groups.pop();
  const words = CONSENT_WORDS[language];
  const records = recordsGroup?.heading.match(words.recordsVersionRe);
  if (visitGroup?.heading !== words.visitHeading || !records || groups.length !== SECTION_KEYS.length) {
    throw new Error("Not a consent text: the visit, the sections or the records agreement are missing.");
  }
  const visit = (visitGroup.chunks[0] ?? "").split("\n").map((line) => {
    const [label, ...value] = line.replace(/^- /, "").split(": ");
    return { label, value: value.join(": ") };
  });
  return {
    language,
    title: titleLine.slice(2),
    templateVersion: Number(versionLine.slice(words.versionPrefix.length)),
    visit,
    sections: groups.map((g, i) => ({ key: SECTION_KEYS[i], heading: g.heading, blocks: g.chunks.flatMap((c) => parseBlocks(c)) })),
    electronicRecords: { heading: records[1], version: records[2], text: recordsGroup!.chunks },
  };
}

/** Problems that stop a template from being published (empty sections, unknown placeholders). */
export function templateProblems(input: { title: string; sections: TemplateSection[] }): { field: string; message: string }[] {
  const problems: { field: string; message: string }[] = [];
  if (!input.title.trim()) problems.push({ field: "title", message: "Give the consent text a title." });
  const check = (field: string, text: string) => {
    for (const m of text.matchAll(PLACEHOLDER_RE)) {
      if (!(PLACEHOLDERS as readonly string[]).includes(m[1])) {
        problems.push({ field, message: `{${m[1]}} is not a known placeholder. Use one of: ${PLACEHOLDERS.map((p) => `{${p}}`).join(", ")}.` });
      }
    }
  };
  check("title", input.title);
  SECTION_KEYS.forEach((key, i) => {
    const section = input.sections.find((s) => s.key === key);
    if (!section) {
      problems.push({ field: `sections.${i}`, message: `The "${SECTION_PURPOSE[key]}" section is missing.` });
      return;
    }
    if (!section.heading.trim()) problems.push({ field: `sections.${i}.heading`, message: "Every section needs a heading." });
    if (!section.body.trim()) problems.push({ field: `sections.${i}.body`, message: "Every section needs some text." });
    const mixed = parseBlocks(section.body).some((b) => b.kind === "p" && b.text.startsWith("- "));
    if (mixed) problems.push({ field: `sections.${i}.body`, message: "In a list, start every line with \"- \", and leave a blank line before and after it." });
    if (/^\s*#/m.test(section.body)) problems.push({ field: `sections.${i}.body`, message: "A line cannot start with #: it is kept for headings." });
    check(`sections.${i}.heading`, section.heading);
    check(`sections.${i}.body`, section.body);
  });
  return problems;
}

const MODE_WORDS: Record<string, string> = { rapid: "rapid", standard: "standard", refined: "refined" };

export function modeLabel(mode: string): string {
  return MODE_WORDS[mode] ?? mode;
}

/** "Tuesday 14 July 2026, 9:30 a.m. EDT" in the clinic's own time zone. */
export function formatInZone(at: Date, timeZone: string): string {
  return new Intl.DateTimeFormat("en-CA", {
    timeZone,
    weekday: "long",
    day: "numeric",
    month: "long",
    year: "numeric",
    hour: "numeric",
    minute: "2-digit",
    timeZoneName: "short",
  }).format(at);
}

export function formatFee(cents: number, currency: string): string {
  return new Intl.NumberFormat("en-CA", { style: "currency", currency }).format(cents / 100);
}
