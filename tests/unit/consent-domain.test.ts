// Consent domain rules: questionnaire flags, the assembled text and its fingerprint, the
// template checks and the drawn-signature rule.
import { describe, expect, it } from "vitest";
import { sha256Hex } from "@/lib/domain/consent-hash";
import { answerLines, QUESTION_KEYS, questionnaireFlags, type QuestionnaireAnswers } from "@/lib/domain/consent-questionnaire";
import { consentFormSchema, nameKey, signConsentSchema } from "@/lib/domain/consent-schemas";
import { inkStats, signatureProblem } from "@/lib/domain/consent-signature";
import {
  assembleConsent, consentText, crownWording, DEFAULT_SECTIONS, DEFAULT_TEMPLATE_TITLE, parseBlocks, parseConsentText, SECTION_KEYS, templateProblems,
  type VisitSummary,
} from "@/lib/domain/consent-text";
import { CATALOGUE, DEFAULT_STAGE_MINUTES } from "@/db/seed/catalogue";
import { estimateTimeline, visitLengthRange } from "@/lib/domain/timeline";

const noAnswers = (): QuestionnaireAnswers => ({
  ...(Object.fromEntries(QUESTION_KEYS.map((k) => [k, "no"])) as Record<(typeof QUESTION_KEYS)[number], "no">),
  otherAllergies: "",
  medicines: "",
  notes: "",
});

const zirconia = { name: "Zirconia", iso6872Class: 5, cementation: ["adhesive", "conventional"] };
const hybrid = { name: "Resin-ceramic hybrid", iso6872Class: null, cementation: ["adhesive"] };

const facts: VisitSummary = {
  patient: "Zoë Łukasiewicz-Núñez",
  tooth: "36 (Universal 19) — lower left first molar",
  material: "Zirconia",
  mode: "standard",
  date: "Wednesday, March 10, 2027 at 8:00 a.m. EST",
  fee: "$1,450.00",
  clinic: "Alder Bay Dental Studio",
  dentist: "Dr Amara Quist",
  length: "about 2 h 45 min to 3 h 15 min",
  ...crownWording(false),
  materialClass: 5,
  dateOfBirth: "1984-03-17",
};

describe("questionnaire flags", () => {
  it("raises nothing when every answer is no and nothing is added", () => {
    expect(questionnaireFlags(noAnswers(), zirconia)).toEqual([]);
  });

  it("flags yes and not-sure answers, alerts first, and says when the patient is not sure", () => {
    const flags = questionnaireFlags({ ...noAnswers(), conditionDiabetes: "yes", allergyLatex: "unsure", medicineAnticoagulants: "yes" }, zirconia);
    expect(flags.map((f) => [f.key, f.level])).toEqual([
      ["allergyLatex", "alert"],
      ["medicineAnticoagulants", "check"],
      ["conditionDiabetes", "check"],
    ]);
    expect(flags[0].detail).toBe("The patient is not sure.");
    expect(flags[2].detail).toBeUndefined();
  });

  it("weighs a methacrylate allergy against a resin-based material ([C] REFERENCES.md: methacrylate allergy is a caution for resin-based materials)", () => {
    const [withHybrid] = questionnaireFlags({ ...noAnswers(), allergyMethacrylates: "yes" }, hybrid);
    expect(withHybrid.level).toBe("alert");
    expect(withHybrid.detail).toContain("Resin-ceramic hybrid) is resin-based");
    const [withZirconia] = questionnaireFlags({ ...noAnswers(), allergyMethacrylates: "yes" }, zirconia);
    expect(withZirconia.detail).not.toContain("is resin-based");
    expect(withZirconia.detail).toContain("Adhesive crown cements are resin-based");
  });

  it("names the chosen material on a grinding flag ([C] REFERENCES.md: bruxism is a caution for ceramics)", () => {
    const [flag] = questionnaireFlags({ ...noAnswers(), grinding: "yes" }, { name: "Lithium disilicate", iso6872Class: 3, cementation: ["adhesive"] });
    expect(flag.label).toBe("Grinds or clenches");
    expect(flag.detail).toContain("Lithium disilicate");
  });

  it("turns other allergies and notes into flags with the patient's words", () => {
    const flags = questionnaireFlags({ ...noAnswers(), otherAllergies: "  penicillin ", notes: "Nervous about injections" });
    expect(flags).toEqual([
      { key: "otherAllergies", level: "alert", label: "Other allergy", detail: "penicillin" },
      { key: "notes", level: "check", label: "Note from the patient", detail: "Nervous about injections" },
    ]);
  });

  it("lists every question with its answer for the record", () => {
    const lines = answerLines({ ...noAnswers(), conditionPregnancy: "unsure" });
    expect(lines).toHaveLength(QUESTION_KEYS.length + 3);
    expect(lines.find((l) => l.question.startsWith("Are you pregnant"))!.answer).toBe("Not sure");
    expect(lines.at(-1)).toEqual({ question: "Anything else the dentist should know", answer: "Nothing given" });
  });
});

describe("consent text", () => {
  const doc = assembleConsent({ title: DEFAULT_TEMPLATE_TITLE, templateVersion: 3, sections: DEFAULT_SECTIONS, facts, materialCautions: ["Looks a little opaque", "Adds furnace time"] });

  it("fills the visit into every section and adds the material's cautions as a list", () => {
    expect(doc.sections.map((s) => s.key)).toEqual([...SECTION_KEYS]);
    const text = consentText(doc);
    expect(text).toContain("tooth 36 (Universal 19) — lower left first molar");
    expect(text).toContain("The fee for this crown is $1,450.00.");
    expect(text).not.toMatch(/\{[a-z]+\}/);
    const material = doc.sections.find((s) => s.key === "material")!;
    expect(material.heading).toBe("About your material: Zirconia");
    expect(material.blocks.at(-1)).toEqual({ kind: "list", items: ["Looks a little opaque", "Adds furnace time"] });
  });

  it("states the visit length from the estimate, never a fixed \"two to three hours\"", () => {
    const text = consentText(doc);
    expect(text).not.toMatch(/two to three hours/);
    expect(text).toContain("the visit takes about 2 h 45 min to 3 h 15 min.");
    expect(doc.visit).toContainEqual({ label: "Expected length", value: "about 2 h 45 min to 3 h 15 min" });
  });

  it("gives each seeded material and mode its own length: the estimate lies inside the range the patient reads", () => {
    const rows = DEFAULT_STAGE_MINUTES.map((s) => ({ stage: s.stage, toothClass: s.toothClass ?? null, minutes: s.minutes }));
    const texts = new Set<string>();
    for (const m of CATALOGUE) for (const mode of m.modes) {
      const minutes = estimateTimeline({ material: m, mode, toothClass: m.toothClasses[0], stageMinutes: rows }).totalMinutes;
      const range = visitLengthRange(minutes);
      expect(range.fromMinutes).toBeLessThanOrEqual(minutes);
      expect(range.toMinutes).toBeGreaterThan(minutes);
      const text = consentText(assembleConsent({ title: DEFAULT_TEMPLATE_TITLE, templateVersion: 1, sections: DEFAULT_SECTIONS, facts: { ...facts, length: range.text, ...crownWording(!!m.provisionalOnly) }, materialCautions: m.cautions }));
      expect(text).toContain(`the visit takes ${range.text}.`);
      for (const c of m.cautions) expect(text).toContain(c);
      texts.add(range.text);
    }
    // 109 to 186 minutes of estimates do not collapse into one fixed phrase.
    expect(texts.size).toBeGreaterThan(3);
  });

  it("uses provisional wording for a provisional material and never promises \"no temporary crown\"", () => {
    const pmma = CATALOGUE.find((m) => m.key === "pmma")!;
    const text = consentText(assembleConsent({ title: DEFAULT_TEMPLATE_TITLE, templateVersion: 1, sections: DEFAULT_SECTIONS, facts: { ...facts, material: pmma.name, ...crownWording(true) }, materialCautions: pmma.cautions }));
    expect(text).toContain("proposes a provisional (temporary) crown for your tooth");
    expect(text).toContain("a final crown is still needed");
    expect(text).not.toContain("no temporary crown");
    expect(consentText(doc)).toContain("no temporary crown");
  });

  it("names no treatment and a two-visit laboratory crown among the alternatives ([P] UK GDC Standards 3.1; ADA Code 1.A)", () => {
    const alternatives = consentText({ ...doc, sections: doc.sections.filter((s) => s.key === "alternatives") });
    expect(alternatives).toMatch(/No treatment for now/);
    expect(alternatives).toMatch(/dental laboratory over two visits/);
  });

  it("lists the common crown risks ([C] REFERENCES.md crown consent risks)", () => {
    const risks = consentText({ ...doc, sections: doc.sections.filter((s) => s.key === "risks") });
    for (const word of ["healthy tooth structure", "numbness", "sensitive", "root canal", "chip or break", "come loose", "bite", "gum", "allergy", "do not last forever"]) {
      expect(risks).toContain(word);
    }
  });

  it("includes the records agreement with paper copies and withdrawal ([P] ESIGN Act, 15 U.S.C. 7001(c))", () => {
    const text = consentText(doc);
    expect(text).toContain("right to a paper copy");
    expect(text).toContain("withdraw this agreement");
    expect(text).toContain("web browser, a PDF reader");
  });

  it("reads its canonical text back into the same consent", () => {
    const text = consentText(doc);
    const back = parseConsentText(text);
    expect(back).toEqual({ ...doc, electronicRecords: { ...doc.electronicRecords, text: [...doc.electronicRecords.text] } });
    expect(consentText(back)).toBe(text);
  });

  it("gives the same fingerprint for the same consent and a different one for any change", () => {
    const a = sha256Hex(consentText(doc));
    const again = assembleConsent({ title: DEFAULT_TEMPLATE_TITLE, templateVersion: 3, sections: DEFAULT_SECTIONS, facts, materialCautions: ["Looks a little opaque", "Adds furnace time"] });
    expect(sha256Hex(consentText(again))).toBe(a);
    const moved = assembleConsent({ title: DEFAULT_TEMPLATE_TITLE, templateVersion: 3, sections: DEFAULT_SECTIONS, facts: { ...facts, date: "Thursday, March 11, 2027 at 8:00 a.m. EST" }, materialCautions: ["Looks a little opaque", "Adds furnace time"] });
    expect(sha256Hex(consentText(moved))).not.toBe(a);
  });

  it("hashes with SHA-256 as FIPS 180-4 specifies", () => {
    // [P] FIPS 180-4 / NIST example: SHA-256("abc").
    expect(sha256Hex("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    expect(sha256Hex(new TextEncoder().encode("abc"))).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });

  it("splits template bodies into paragraphs and lists", () => {
    expect(parseBlocks("One\nline.\n\n- a\n- b\n\n\nTwo.")).toEqual([
      { kind: "p", text: "One line." },
      { kind: "list", items: ["a", "b"] },
      { kind: "p", text: "Two." },
    ]);
  });
});

describe("template checks", () => {
  it("accepts the default template", () => {
    expect(templateProblems({ title: DEFAULT_TEMPLATE_TITLE, sections: DEFAULT_SECTIONS })).toEqual([]);
  });

  it("refuses unknown placeholders, missing sections, heading marks and half-lists", () => {
    const sections = DEFAULT_SECTIONS.map((s) => (s.key === "costs" ? { ...s, body: "The fee is {price}." } : s));
    expect(templateProblems({ title: "T", sections })[0]).toMatchObject({ field: "sections.5.body", message: expect.stringContaining("{price} is not a known placeholder") });
    expect(templateProblems({ title: "T", sections: DEFAULT_SECTIONS.slice(1) })[0].message).toContain("What will be done");
    const hash = DEFAULT_SECTIONS.map((s) => (s.key === "benefits" ? { ...s, body: "# Big" } : s));
    expect(templateProblems({ title: "T", sections: hash })[0].message).toContain("cannot start with #");
    const half = DEFAULT_SECTIONS.map((s) => (s.key === "benefits" ? { ...s, body: "- one\ntwo" } : s));
    expect(templateProblems({ title: "T", sections: half })[0].message).toContain("In a list");
  });
});

describe("form schema", () => {
  const valid = { answers: noAnswers(), acknowledged: [...SECTION_KEYS], electronicRecords: true, typedName: "Zoë Ruiz" };

  it("needs every section acknowledged and the records agreement", () => {
    expect(consentFormSchema.safeParse(valid).success).toBe(true);
    const missing = consentFormSchema.safeParse({ ...valid, acknowledged: SECTION_KEYS.slice(0, -1) });
    expect(missing.success).toBe(false);
    expect(missing.error!.issues[0]).toMatchObject({ path: ["acknowledged"], message: "Please read and tick every section before signing." });
    expect(consentFormSchema.safeParse({ ...valid, electronicRecords: false }).error!.issues[0].path).toEqual(["electronicRecords"]);
  });

  it("needs a PNG data URL for the signature", () => {
    const base = { ...valid, appointmentId: crypto.randomUUID(), templateId: crypto.randomUUID(), textSha256: "a".repeat(64) };
    expect(signConsentSchema.safeParse({ ...base, signature: "data:image/png;base64,AAAA" }).success).toBe(true);
    expect(signConsentSchema.safeParse({ ...base, signature: "data:image/jpeg;base64,AAAA" }).success).toBe(false);
  });

  it("compares typed names without accents, case or spacing", () => {
    expect(nameKey("  zoe   LUKASIEWICZ-nunez ")).toBe(nameKey("Zoë Łukasiewicz-Núñez"));
    expect(nameKey("Zoe Lukas")).not.toBe(nameKey("Zoë Łukasiewicz-Núñez"));
  });
});

describe("drawn signature rule", () => {
  function canvas(width: number, height: number, draw: (set: (x: number, y: number) => void) => void) {
    const rgba = new Uint8Array(width * height * 4);
    draw((x, y) => {
      for (let dy = 0; dy < 3; dy++) for (let dx = 0; dx < 3; dx++) {
        const px = x + dx, py = y + dy;
        if (px >= width || py >= height) continue;
        const i = (py * width + px) * 4;
        rgba[i + 3] = 255; // black ink, opaque
      }
    });
    return inkStats(rgba, width, height);
  }

  it("refuses an empty box, a dot and a straight dash", () => {
    expect(signatureProblem(canvas(600, 200, () => undefined))).toBe("Please draw your signature in the box.");
    expect(signatureProblem(canvas(600, 200, (set) => set(300, 100)))).toMatch(/too small or too simple/);
    expect(signatureProblem(canvas(600, 200, (set) => { for (let x = 100; x < 400; x++) set(x, 100); }))).toMatch(/too small or too simple/);
  });

  it("accepts a signature-like wave across the box", () => {
    const stats = canvas(600, 200, (set) => { for (let x = 40; x < 520; x++) set(x, Math.round(100 + 50 * Math.sin(x / 25))); });
    expect(stats.box).toEqual({ left: 40, top: 50, right: 521, bottom: 152 });
    expect(signatureProblem(stats)).toBeNull();
  });

  it("does not count white or faint pixels as ink", () => {
    const rgba = new Uint8Array(4 * 4 * 4).fill(255); // opaque white
    expect(inkStats(rgba, 4, 4).inked).toBe(0);
    const faint = new Uint8Array(4 * 4 * 4);
    for (let i = 3; i < faint.length; i += 4) faint[i] = 20;
    expect(inkStats(faint, 4, 4).inked).toBe(0);
  });
});
