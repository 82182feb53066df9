// The health questionnaire a patient fills before signing consent, and the flags staff see.
// Pure: the questions, the answer shape and the rule that turns answers into flags.

export const ANSWERS = ["no", "yes", "unsure"] as const;
export type Answer = (typeof ANSWERS)[number];

export const ANSWER_LABELS: Record<Answer, string> = { no: "No", yes: "Yes", unsure: "Not sure" };

export const QUESTION_KEYS = [
  "allergyLatex",
  "allergyMetals",
  "allergyMethacrylates",
  "allergyLocalAnaesthetics",
  "medicineAnticoagulants",
  "medicineBisphosphonates",
  "conditionHeart",
  "conditionPregnancy",
  "conditionDiabetes",
  "grinding",
  "anaesthesiaReaction",
] as const;
export type QuestionKey = (typeof QUESTION_KEYS)[number];

/** "alert": the dentist must act on it before starting; "check": the dentist should look at it. */
export type FlagLevel = "alert" | "check";

export type Question = {
  key: QuestionKey;
  group: "Allergies" | "Medicines" | "Health" | "Habits and past reactions";
  /** What the patient reads. */
  text: string;
  hint?: string;
  /** What staff read when the answer needs attention. */
  flag: string;
  level: FlagLevel;
};

export const QUESTIONS: Question[] = [
  { key: "allergyLatex", group: "Allergies", text: "Are you allergic to latex (rubber gloves, balloons)?", flag: "Latex allergy", level: "alert" },
  { key: "allergyMetals", group: "Allergies", text: "Are you allergic to any metal (for example nickel in jewellery)?", flag: "Metal allergy", level: "check" },
  {
    key: "allergyMethacrylates",
    group: "Allergies",
    text: "Are you allergic to acrylics, methacrylates or dental resins (for example in nail products or earlier fillings)?",
    flag: "Methacrylate or resin allergy",
    level: "alert",
  },
  {
    key: "allergyLocalAnaesthetics",
    group: "Allergies",
    text: "Are you allergic to local anaesthetics (the injection that numbs your mouth)?",
    flag: "Local anaesthetic allergy",
    level: "alert",
  },
  {
    key: "medicineAnticoagulants",
    group: "Medicines",
    text: "Do you take blood thinners (anticoagulants or medicines that stop blood clotting)?",
    hint: "For example daily aspirin, warfarin or similar medicines.",
    flag: "Takes blood thinners",
    level: "check",
  },
  {
    key: "medicineBisphosphonates",
    group: "Medicines",
    text: "Do you take, or have you taken, medicines for bone strength (bisphosphonates), as tablets or injections?",
    flag: "Bone-strength medicines (bisphosphonates)",
    level: "check",
  },
  {
    key: "conditionHeart",
    group: "Health",
    text: "Do you have a heart condition (for example an artificial heart valve, a pacemaker or a past heart infection)?",
    flag: "Heart condition",
    level: "check",
  },
  { key: "conditionPregnancy", group: "Health", text: "Are you pregnant, or could you be?", flag: "Pregnant or may be pregnant", level: "check" },
  { key: "conditionDiabetes", group: "Health", text: "Do you have diabetes?", flag: "Diabetes", level: "check" },
  {
    key: "grinding",
    group: "Habits and past reactions",
    text: "Do you grind or clench your teeth (for example at night)?",
    flag: "Grinds or clenches",
    level: "check",
  },
  {
    key: "anaesthesiaReaction",
    group: "Habits and past reactions",
    text: "Have you ever reacted badly to a dental injection or anaesthesia (fainting, racing heart, rash, swelling)?",
    flag: "Earlier reaction to anaesthesia",
    level: "alert",
  },
];

export type QuestionnaireAnswers = Record<QuestionKey, Answer> & {
  /** Other allergies, in the patient's own words. */
  otherAllergies: string;
  /** Medicines the patient takes, in their own words. */
  medicines: string;
  /** Anything else the dentist should know. */
  notes: string;
};

export type ConsentFlag = { key: string; level: FlagLevel; label: string; detail?: string };

/** What the flag rule needs to know about the chosen material. */
export type FlagMaterial = { name: string; iso6872Class: number | null; cementation: readonly string[] };

/** Resin-ceramic hybrids and PMMA have no ISO 6872 class: they are resin-based, not ceramics. */
export function isResinBased(material: FlagMaterial): boolean {
  return material.iso6872Class === null;
}

/**
 * Turns answers into flags for the dentist. "Yes" and "not sure" both need attention;
 * some answers weigh more with the chosen material (sources in REFERENCES.md, [C]:
 * methacrylate allergy is a caution for resin-based materials, bruxism for ceramics).
 */
export function questionnaireFlags(answers: QuestionnaireAnswers, material?: FlagMaterial): ConsentFlag[] {
  const flags: ConsentFlag[] = [];
  for (const q of QUESTIONS) {
    const answer = answers[q.key];
    if (answer !== "yes" && answer !== "unsure") continue;
    const details: string[] = [];
    if (answer === "unsure") details.push("The patient is not sure.");
    if (material && q.key === "allergyMethacrylates") {
      if (isResinBased(material)) details.push(`The chosen material (${material.name}) is resin-based.`);
      if (material.cementation.includes("adhesive")) details.push("Adhesive crown cements are resin-based.");
    }
    if (material && q.key === "grinding") {
      details.push(`Grinding is a caution for the chosen material (${material.name}): check its strength and thickness.`);
    }
    flags.push({ key: q.key, level: q.level, label: q.flag, ...(details.length ? { detail: details.join(" ") } : {}) });
  }
  const other = answers.otherAllergies.trim();
  if (other) flags.push({ key: "otherAllergies", level: "alert", label: "Other allergy", detail: other });
  const notes = answers.notes.trim();
  if (notes) flags.push({ key: "notes", level: "check", label: "Note from the patient", detail: notes });
  // Alerts first, then checks, each in question order.
  return flags.sort((a, b) => (a.level === b.level ? 0 : a.level === "alert" ? -1 : 1));
}

/** Answers as question/answer lines, for the PDF and the staff screen. */
export function answerLines(answers: QuestionnaireAnswers): { question: string; answer: string }[] {
  const lines = QUESTIONS.map((q) => ({ question: q.text, answer: ANSWER_LABELS[answers[q.key]] }));
  lines.push({ question: "Other allergies", answer: answers.otherAllergies.trim() || "None given" });
  lines.push({ question: "Medicines you take", answer: answers.medicines.trim() || "None given" });
  lines.push({ question: "Anything else the dentist should know", answer: answers.notes.trim() || "Nothing given" });
  return lines;
}
