// The clinic manager's form for a material's patient-facing texts in English and French. One schema,
// shared by the browser form and the server action; pros and cautions are typed one per line.
import { z } from "zod";

export const MATERIAL_TEXT_LIMITS = { name: 80, description: 1200, lines: 8, line: 300 } as const;

const L = MATERIAL_TEXT_LIMITS;

/** A textarea of one item per line, or an already-split list: blank lines dropped, each line capped. */
const lineList = (what: string) =>
  z
    .union([z.string().max(L.lines * (L.line + 2), { message: `Keep the ${what} shorter.` }), z.array(z.string()).max(L.lines * 4)])
    .transform((v) => (Array.isArray(v) ? v : v.split(/\r?\n/)).map((s) => s.trim()).filter(Boolean))
    // Checked on the whole list, so the message belongs to the textarea rather than to one line.
    .pipe(
      z
        .array(z.string())
        .max(L.lines, { message: `Give at most ${L.lines} ${what}.` })
        .refine((lines) => lines.every((s) => s.length <= L.line), { message: `Keep each of the ${what} under ${L.line} characters.` }),
    );

const texts = (language: string) =>
  z.object({
    name: z.string().trim().min(1, { message: `Give the ${language} name.` }).max(L.name, { message: `Keep the ${language} name under ${L.name} characters.` }),
    description: z
      .string()
      .trim()
      .min(1, { message: `Give the ${language} description.` })
      .max(L.description, { message: `Keep the ${language} description under ${L.description} characters.` }),
    pros: lineList(`${language} advantages`),
    cautions: lineList(`${language} cautions`),
  });

/** Cautions are given in both languages or in neither: a caution one reader would miss is unsafe. */
export const CAUTIONS_RULE = "Cautions are given in both languages or in neither: a caution that the English or the French reader would miss is unsafe.";

export const materialTextsSchema = z
  .object({ materialId: z.uuid({ message: "That is not a valid material." }), en: texts("English"), fr: texts("French") })
  .superRefine((v, ctx) => {
    if (v.en.cautions.length > 0 && v.fr.cautions.length === 0) ctx.addIssue({ code: "custom", path: ["fr", "cautions"], message: "Give the French cautions too: the English texts have some, and a caution the French reader would miss is unsafe." });
    if (v.fr.cautions.length > 0 && v.en.cautions.length === 0) ctx.addIssue({ code: "custom", path: ["en", "cautions"], message: "Give the English cautions too: the French texts have some, and a caution the English reader would miss is unsafe." });
  });

export type MaterialTextsInput = z.input<typeof materialTextsSchema>;
export type MaterialTextsValue = z.output<typeof materialTextsSchema>;

/** The form's starting values from stored texts (lists joined one per line). */
export function materialTextsFormValues(m: { id: string; en: StoredTexts; fr: StoredTexts | null }): MaterialTextsInput {
  const side = (t: StoredTexts | null) => ({ name: t?.name ?? "", description: t?.description ?? "", pros: (t?.pros ?? []).join("\n"), cautions: (t?.cautions ?? []).join("\n") });
  return { materialId: m.id, en: side(m.en), fr: side(m.fr) };
}

type StoredTexts = { name?: string; description: string; pros: string[]; cautions: string[] };
