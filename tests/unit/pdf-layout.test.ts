// Consent PDF layout: line breaking is linear in the text (widths cached, long words split in one
// pass), every line fits when pdf-lib itself measures it, and the cached glyph encoding draws the
// same glyphs fontkit's shaping would. Text caps apply to everything laid out.
import { readFileSync } from "node:fs";
import fontkit from "@pdf-lib/fontkit";
import { PDFDocument, type PDFFont } from "pdf-lib";
import { describe, expect, it, vi } from "vitest";
import { limitPdfInput, type ConsentPdfInput } from "@/lib/consent/pdf";
import { cacheGlyphEncoding, Measure, wrapText } from "@/lib/consent/pdf-layout";
import { clipText, TEXT_LIMITS } from "@/lib/domain/text-limits";

const FONT = readFileSync("public/fonts/DejaVuSans.ttf");

async function font(): Promise<PDFFont> {
  const doc = await PDFDocument.create();
  doc.registerFontkit(fontkit);
  return doc.embedFont(FONT, { subset: true });
}

const WIDTH = 483; // the consent page's text width in points (A4 less two 56 pt margins)

describe("wrapText", () => {
  it("splits a 1,000-character word into lines that fit, losing nothing, with each character measured once", async () => {
    const f = await font();
    const word = "Ab3é".repeat(250);
    const measured = vi.spyOn(f, "widthOfTextAtSize");
    const lines = wrapText(`Answer: ${word} done`, new Measure(f, 10.5), WIDTH);
    // The quadratic-per-piece search this replaces measured thousands of prefixes; here one call
    // per distinct character (A, b, 3, é, the space and the letters of the other words).
    expect(measured.mock.calls.length).toBeLessThanOrEqual(16);
    measured.mockRestore();
    expect(lines.join("").replace(/ /g, "")).toBe(`Answer:${word}done`);
    // [C] pdf-lib's own measure of each drawn line, the width the page actually uses.
    for (const line of lines) expect(f.widthOfTextAtSize(line, 10.5)).toBeLessThanOrEqual(WIDTH + 1e-9);
    expect(lines.length).toBeGreaterThan(10);
  });

  it("breaks ordinary text greedily at spaces: every line fits and the next word would not", async () => {
    const f = await font();
    const text = "Zirconia crowns are milled from pre-sintered blanks and then sintered; the dentist decides with the patient which material suits the tooth. ".repeat(6);
    const lines = wrapText(text.trim(), new Measure(f, 10.5), WIDTH);
    lines.forEach((line, i) => {
      expect(f.widthOfTextAtSize(line, 10.5)).toBeLessThanOrEqual(WIDTH + 1e-9);
      const next = lines[i + 1]?.split(" ")[0];
      if (next) expect(f.widthOfTextAtSize(`${line} ${next}`, 10.5)).toBeGreaterThan(WIDTH);
    });
    expect(lines.join(" ")).toBe(text.trim());
  });

  it("keeps paragraphs and drops control characters", async () => {
    const f = await font();
    expect(wrapText("one\n\ntwo\u0007", new Measure(f, 9), WIDTH)).toEqual(["one", "", "two"]);
  });

  it("takes time in proportion to the text, not its square", async () => {
    const f = await font();
    const m = new Measure(f, 10.5);
    const time = (n: number) => {
      const text = "x".repeat(n);
      const start = process.cpuUsage();
      for (let i = 0; i < 5; i++) wrapText(text, m, WIDTH);
      const used = process.cpuUsage(start);
      return (used.user + used.system) / 1000;
    };
    time(5_000); // warm up
    const small = Math.max(time(10_000), 0.5);
    const large = time(100_000);
    // Ten times the text: linear work takes about ten times as long; the old quadratic search
    // took about a hundred times. [C] a wide margin for a shared machine.
    expect(large / small).toBeLessThan(40);
  });
});

describe("cacheGlyphEncoding", () => {
  it("encodes Latin, Greek and Cyrillic text to the same glyphs as fontkit's shaping", async () => {
    const [plain, cached] = [await font(), await font()];
    cacheGlyphEncoding(cached);
    for (const text of ["Zoë Łukasiewicz-Núñez — 36 (Universal 19)", "Ελένη Παπαδοπούλου", "Светлана Іваненко", "ﬁ fi ffl “quoted” … ✓ •"]) {
      expect(cached.encodeText(text).toString(), text).toBe(plain.encodeText(text).toString());
    }
  });

  it("leaves text that needs shaping to fontkit", async () => {
    const cached = await font();
    const shaped = vi.spyOn(cached, "encodeText");
    cacheGlyphEncoding(cached);
    cached.encodeText("مرحبا");
    expect(shaped).toHaveBeenCalledWith("مرحبا");
  });
});

describe("text caps", () => {
  it("clips by code points and marks the cut", () => {
    expect(clipText("abcdef", 4)).toBe("abc…");
    expect(clipText("abc", 4)).toBe("abc");
    expect(clipText("😀😀😀😀😀", 3)).toBe("😀😀…");
  });

  it("caps every text that reaches the PDF, whatever its path", () => {
    const long = "y".repeat(20_000);
    const input = {
      consentId: "c", pdfVersion: 1, clinic: { name: long, address: long }, patientName: long,
      document: { title: long, templateVersion: 1, visit: [{ label: long, value: long }], sections: [{ key: "treatment", heading: long, blocks: [{ kind: "p", text: long }, { kind: "list", items: [long] }] }], electronicRecords: { version: "1", heading: long, text: [long] } },
      acknowledgedAll: true, answers: [{ question: long, answer: long }], flags: [{ key: "notes", level: "check", label: long, detail: long }],
      typedName: long, signaturePng: new Uint8Array(), signedAt: long, textSha256: long,
      audit: [{ event: long, who: long, at: long, ip: long, userAgent: long }], review: { by: long, at: long }, previous: { version: 1, sha256: long }, createdAt: new Date(),
    } as unknown as ConsentPdfInput;
    const out = limitPdfInput(input);
    expect(out.audit[0].userAgent).toHaveLength(TEXT_LIMITS.userAgent);
    expect(out.audit[0].ip).toHaveLength(TEXT_LIMITS.ip);
    expect(out.answers[0].answer).toHaveLength(TEXT_LIMITS.answer);
    expect(out.typedName).toHaveLength(TEXT_LIMITS.personName);
    expect(out.clinic.name).toHaveLength(TEXT_LIMITS.clinicName);
    // Nothing anywhere in the input is left longer than the largest cap.
    const strings = JSON.stringify(out, (_k, v) => (typeof v === "string" ? v.length : v));
    const lengths = [...strings.matchAll(/:(\d+)/g)].map((m) => Number(m[1]));
    expect(Math.max(...lengths)).toBeLessThanOrEqual(TEXT_LIMITS.sectionBody);
  });
});
