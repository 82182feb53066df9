// The material-texts form schema: lines split and trimmed, caps enforced, cautions in both languages or neither.
import { describe, expect, it } from "vitest";
import { MATERIAL_TEXT_LIMITS, materialTextsFormValues, materialTextsSchema } from "@/lib/domain/material-text-schemas";

const id = "7d0c2f52-2b8e-4b8f-9a53-1f2e3d4c5b6a";
const side = (cautions: string) => ({ name: "N", description: "D", pros: "", cautions });
const issues = (input: unknown) => {
  const r = materialTextsSchema.safeParse(input);
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join("."), message: i.message }));
};

describe("materialTextsSchema", () => {
  it("splits one item per line, dropping blank lines", () => {
    const v = materialTextsSchema.parse({ materialId: id, en: { ...side("a\r\n\n b "), pros: "x\ny" }, fr: side("c") });
    expect(v.en.cautions).toEqual(["a", "b"]);
    expect(v.en.pros).toEqual(["x", "y"]);
  });

  it("accepts cautions in both languages or in neither", () => {
    expect(issues({ materialId: id, en: side("a"), fr: side("b") })).toEqual([]);
    expect(issues({ materialId: id, en: side(""), fr: side(" ") })).toEqual([]);
  });

  it("refuses cautions in one language only, pointing at the empty one", () => {
    expect(issues({ materialId: id, en: side("a"), fr: side("") }).map((i) => i.path)).toEqual(["fr.cautions"]);
    expect(issues({ materialId: id, en: side(""), fr: side("b") }).map((i) => i.path)).toEqual(["en.cautions"]);
  });

  it("caps the number and length of lines and the name", () => {
    const many = Array.from({ length: MATERIAL_TEXT_LIMITS.lines + 1 }, (_, i) => `c${i}`).join("\n");
    expect(issues({ materialId: id, en: side(many), fr: side("b") }).map((i) => i.path)).toEqual(["en.cautions"]);
    const long = "x".repeat(MATERIAL_TEXT_LIMITS.line + 1);
    expect(issues({ materialId: id, en: side(long), fr: side("b") }).map((i) => i.path)).toEqual(["en.cautions"]);
    expect(issues({ materialId: id, en: { ...side("a"), name: "n".repeat(MATERIAL_TEXT_LIMITS.name + 1) }, fr: side("b") }).map((i) => i.path)).toEqual(["en.name"]);
    expect(issues({ materialId: id, en: { ...side("a"), description: "  " }, fr: side("b") }).map((i) => i.path)).toEqual(["en.description"]);
  });

  it("round-trips stored texts through the form's starting values", () => {
    const en = { name: "A", description: "B", pros: ["p1", "p2"], cautions: ["c1"] };
    const fr = { name: "Á", description: "É", pros: ["q"], cautions: ["d1", "d2"] };
    const v = materialTextsSchema.parse(materialTextsFormValues({ id, en, fr }));
    expect(v).toEqual({ materialId: id, en, fr });
  });
});
