// zod schemas shared by the consent forms in the browser and the route handlers on the server.
import { z } from "zod";
import { ANSWERS, QUESTION_KEYS, type QuestionKey } from "./consent-questionnaire";
import { SECTION_KEYS } from "./consent-text";
import { TEXT_LIMITS } from "./text-limits";

const answer = z.enum(ANSWERS, { message: "Choose an answer." });
const freeText = (max: number) => z.string().trim().max(max, { message: `Keep this under ${max} characters.` });

export const questionnaireSchema = z.object({
  ...(Object.fromEntries(QUESTION_KEYS.map((k) => [k, answer])) as Record<QuestionKey, typeof answer>),
  otherAllergies: freeText(TEXT_LIMITS.otherAllergies),
  medicines: freeText(TEXT_LIMITS.answer),
  notes: freeText(TEXT_LIMITS.answer),
});

/** The patient's part of the form: answers, acknowledgements, the records agreement and the typed name. */
export const consentFormSchema = z.object({
  answers: questionnaireSchema,
  acknowledged: z
    .array(z.enum(SECTION_KEYS))
    .refine((keys) => SECTION_KEYS.every((k) => keys.includes(k)), { message: "Please read and tick every section before signing." }),
  electronicRecords: z.literal(true, { message: "Please agree to sign and receive records electronically, or ask the clinic for paper." }),
  typedName: z.string().trim().min(2, { message: "Type your full name." }).max(TEXT_LIMITS.personName, { message: "That name is too long." }),
});
export type ConsentFormInput = z.input<typeof consentFormSchema>;
export type ConsentFormValues = z.output<typeof consentFormSchema>;

/** What the browser posts to sign: the form plus which text it showed and the drawn signature. */
export const signConsentSchema = consentFormSchema.extend({
  appointmentId: z.uuid({ message: "That visit is not valid." }),
  templateId: z.uuid({ message: "That consent text is not valid." }),
  textSha256: z.string().regex(/^[0-9a-f]{64}$/, { message: "The consent text fingerprint is not valid." }),
  signature: z.string().startsWith("data:image/png;base64,", { message: "Please draw your signature in the box." }),
});
export type SignConsentInput = z.output<typeof signConsentSchema>;

export const withdrawConsentSchema = z.object({
  reason: freeText(TEXT_LIMITS.withdrawReason).optional(),
});

/** The clinic manager's template editor: a title and one heading and body per section, in English and in French. */
const templateTextSchema = z.object({
  title: z.string().trim().min(3, { message: "Give the consent text a title." }).max(TEXT_LIMITS.templateTitle, { message: `Keep the title under ${TEXT_LIMITS.templateTitle} characters.` }),
  sections: z
    .array(
      z.object({
        key: z.enum(SECTION_KEYS),
        heading: z.string().trim().min(2, { message: "Every section needs a heading." }).max(TEXT_LIMITS.sectionHeading, { message: `Keep headings under ${TEXT_LIMITS.sectionHeading} characters.` }),
        body: z.string().trim().min(10, { message: "Every section needs some text." }).max(TEXT_LIMITS.sectionBody, { message: "Keep each section under 8,000 characters." }),
      }),
    )
    .length(SECTION_KEYS.length, { message: "Every section must be there." }),
});
// Both languages are published together: a version missing its French text cannot be published.
export const FRENCH_MISSING = "Add the French text: both languages are published together.";
export const templateFormSchema = templateTextSchema.extend({
  fr: templateTextSchema.optional().transform((fr, ctx) => {
    if (!fr) ctx.addIssue({ code: "custom", message: FRENCH_MISSING });
    return fr!;
  }),
});
export type TemplateFormValues = z.output<typeof templateFormSchema>;
export type TemplateFormInput = z.input<typeof templateFormSchema>;

const FOLD = { ł: "l", ø: "o", đ: "d", ß: "ss", æ: "ae", œ: "oe" };

/** Normalises a name for comparison: no accents, case or extra spaces. */
export function nameKey(name: string): string {
  const folded = name.normalize("NFD").replace(/\p{M}/gu, "").toLowerCase();
  // Letters that do not decompose under NFD.
  const plain = folded.replace(/[łøđßæœ]/g, (c) => (FOLD as Record<string, string>)[c] ?? c);
  return plain.replace(/[^\p{L}\p{N}]+/gu, " ").trim();
}
