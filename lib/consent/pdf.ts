// Lays out a consent as a PDF (pdf-lib with the shipped DejaVu TTF fonts, so every name renders):
// the consent text, the visit, the questionnaire and flags, the signature, and an audit page.
// Returns the pdf-lib document unsaved, so the seal can add its placeholder before saving.
import { readFile } from "node:fs/promises";
import path from "node:path";
import fontkit from "@pdf-lib/fontkit";
import { PDFDocument, rgb, type PDFFont, type PDFImage, type PDFPage, type RGB } from "pdf-lib";
import type { ConsentFlag } from "@/lib/domain/consent-questionnaire";
import type { AssembledConsent } from "@/lib/domain/consent-text";

export type AuditLine = { event: string; who: string; at: string; ip: string; userAgent: string };

export type ConsentPdfInput = {
  consentId: string;
  pdfVersion: number;
  clinic: { name: string; address: string };
  patientName: string;
  /** Parsed from the signed text, so the PDF shows exactly what was signed. */
  document: AssembledConsent;
  acknowledgedAll: boolean;
  answers: { question: string; answer: string }[];
  flags: ConsentFlag[];
  typedName: string;
  signaturePng: Uint8Array;
  signedAt: string;
  textSha256: string;
  audit: AuditLine[];
  review: { by: string; at: string } | null;
  previous: { version: number; sha256: string } | null;
  createdAt: Date;
};

const PAGE = { width: 595.28, height: 841.89, margin: 56, bottom: 64 };
const INK = rgb(0.12, 0.16, 0.22);
const MUTED = rgb(0.33, 0.38, 0.43);
const HARBOUR = rgb(0.05, 0.43, 0.43);
const CLAY = rgb(0.54, 0.23, 0.13);
const CLAY_BG = rgb(0.98, 0.94, 0.91);
const OCHRE = rgb(0.43, 0.33, 0.05);
const OCHRE_BG = rgb(0.98, 0.96, 0.87);
const LINE = rgb(0.85, 0.83, 0.78);

type Fonts = { regular: PDFFont; bold: PDFFont };

// Only characters the font can draw: control characters would break the content stream.
function clean(text: string): string {
  return text.normalize("NFC").replace(/\t/g, " ").replace(/[\u0000-\u001f\u007f]/g, "");
}

class Writer {
  page!: PDFPage;
  y = 0;
  readonly width = PAGE.width - PAGE.margin * 2;

  constructor(readonly doc: PDFDocument, readonly fonts: Fonts) {
    this.newPage();
  }

  newPage() {
    this.page = this.doc.addPage([PAGE.width, PAGE.height]);
    this.y = PAGE.height - PAGE.margin;
  }

  ensure(height: number) {
    if (this.y - height < PAGE.bottom) this.newPage();
  }

  gap(points: number) {
    this.y -= points;
  }

  wrap(text: string, font: PDFFont, size: number, width: number): string[] {
    const lines: string[] = [];
    for (const paragraph of clean(text).split(/\n/)) {
      let line = "";
      for (const word of paragraph.split(/ +/)) {
        const candidate = line ? `${line} ${word}` : word;
        if (font.widthOfTextAtSize(candidate, size) <= width) {
          line = candidate;
          continue;
        }
        if (line) lines.push(line);
        // A word longer than the line (a hash, a user agent) is broken by characters.
        let rest = word;
        while (font.widthOfTextAtSize(rest, size) > width) {
          let cut = rest.length - 1;
          while (cut > 1 && font.widthOfTextAtSize(rest.slice(0, cut), size) > width) cut--;
          lines.push(rest.slice(0, cut));
          rest = rest.slice(cut);
        }
        line = rest;
      }
      lines.push(line);
    }
    return lines;
  }

  text(text: string, opts: { size?: number; bold?: boolean; color?: RGB; indent?: number; width?: number; after?: number } = {}) {
    const size = opts.size ?? 10.5;
    const font = opts.bold ? this.fonts.bold : this.fonts.regular;
    const indent = opts.indent ?? 0;
    const leading = size * 1.4;
    for (const line of this.wrap(text, font, size, (opts.width ?? this.width) - indent)) {
      this.ensure(leading);
      this.y -= leading;
      if (line) this.page.drawText(line, { x: PAGE.margin + indent, y: this.y + size * 0.3, size, font, color: opts.color ?? INK });
    }
    this.gap(opts.after ?? 4);
  }

  heading(text: string, size = 13) {
    this.ensure(size * 4);
    this.gap(8);
    this.text(text, { size, bold: true, color: HARBOUR, after: 2 });
  }

  bullet(text: string) {
    const size = 10.5;
    this.ensure(size * 1.4);
    this.page.drawText("•", { x: PAGE.margin + 4, y: this.y - size * 1.4 + size * 0.3, size, font: this.fonts.regular, color: INK });
    this.text(text, { indent: 16, after: 2 });
  }

  rule() {
    this.ensure(12);
    this.gap(6);
    this.page.drawLine({ start: { x: PAGE.margin, y: this.y }, end: { x: PAGE.width - PAGE.margin, y: this.y }, thickness: 0.75, color: LINE });
    this.gap(6);
  }

  row(label: string, value: string) {
    const labelWidth = 150;
    const size = 10.5;
    const leading = size * 1.4;
    const labelLines = this.wrap(label, this.fonts.bold, size, labelWidth - 8);
    const valueLines = this.wrap(value, this.fonts.regular, size, this.width - labelWidth);
    const n = Math.max(labelLines.length, valueLines.length);
    this.ensure(leading * Math.min(n, 4));
    for (let i = 0; i < n; i++) {
      this.ensure(leading);
      this.y -= leading;
      const baseline = this.y + size * 0.3;
      if (labelLines[i]) this.page.drawText(labelLines[i], { x: PAGE.margin, y: baseline, size, font: this.fonts.bold, color: MUTED });
      if (valueLines[i]) this.page.drawText(valueLines[i], { x: PAGE.margin + labelWidth, y: baseline, size, font: this.fonts.regular, color: INK });
    }
    this.gap(3);
  }

  /** A label with a long unbroken value (a fingerprint) on its own full-width line. */
  fingerprint(label: string, value: string) {
    this.text(label, { size: 9.5, bold: true, color: MUTED, after: 0 });
    this.text(value, { size: 9, after: 4 });
  }

  /** A flag in a tinted box with its level spelled out, so it does not rely on colour. */
  flag(flag: ConsentFlag) {
    const size = 10.5;
    const leading = size * 1.4;
    const tag = flag.level === "alert" ? "ALERT" : "CHECK";
    const body = flag.detail ? `${flag.label}. ${flag.detail}` : flag.label;
    const lines = this.wrap(body, this.fonts.regular, size, this.width - 70);
    const height = lines.length * leading + 10;
    this.ensure(height + 4);
    const top = this.y;
    this.page.drawRectangle({
      x: PAGE.margin, y: top - height, width: this.width, height,
      color: flag.level === "alert" ? CLAY_BG : OCHRE_BG, borderColor: flag.level === "alert" ? CLAY : OCHRE, borderWidth: 0.75,
    });
    this.page.drawText(tag, { x: PAGE.margin + 8, y: top - 5 - leading + size * 0.3, size: 9, font: this.fonts.bold, color: flag.level === "alert" ? CLAY : OCHRE });
    lines.forEach((line, i) => {
      this.page.drawText(line, { x: PAGE.margin + 62, y: top - 5 - (i + 1) * leading + size * 0.3, size, font: this.fonts.regular, color: INK });
    });
    this.y = top - height - 4;
  }

  image(image: PDFImage, maxWidth: number, maxHeight: number) {
    const scale = Math.min(maxWidth / image.width, maxHeight / image.height, 1);
    const w = image.width * scale;
    const h = image.height * scale;
    this.ensure(h + 8);
    this.page.drawRectangle({ x: PAGE.margin, y: this.y - h - 8, width: maxWidth + 8, height: h + 8, borderColor: LINE, borderWidth: 0.75 });
    this.page.drawImage(image, { x: PAGE.margin + 4, y: this.y - h - 4, width: w, height: h });
    this.y -= h + 14;
  }
}

let fontBytes: Promise<[Buffer, Buffer]> | undefined;
function loadFonts(): Promise<[Buffer, Buffer]> {
  // Literal paths, so the build traces only these two files.
  fontBytes ??= Promise.all([
    readFile(path.join(process.cwd(), "public/fonts/DejaVuSans.ttf")),
    readFile(path.join(process.cwd(), "public/fonts/DejaVuSans-Bold.ttf")),
  ]);
  return fontBytes;
}

export async function buildConsentPdf(input: ConsentPdfInput): Promise<PDFDocument> {
  const doc = await PDFDocument.create();
  doc.registerFontkit(fontkit);
  const [regularBytes, boldBytes] = await loadFonts();
  const fonts = { regular: await doc.embedFont(regularBytes, { subset: true }), bold: await doc.embedFont(boldBytes, { subset: true }) };
  const signature = await doc.embedPng(input.signaturePng);
  const d = input.document;

  doc.setTitle(`${d.title} — ${input.patientName}`, { showInWindowTitleBar: true });
  doc.setAuthor(input.clinic.name);
  doc.setSubject(`Informed consent ${input.consentId}, PDF version ${input.pdfVersion}`);
  doc.setKeywords(["consent", input.consentId, `template version ${d.templateVersion}`]);
  doc.setCreator("Cuspal");
  doc.setProducer("Cuspal");
  doc.setCreationDate(input.createdAt);
  doc.setModificationDate(input.createdAt);
  doc.setLanguage("en");

  const w = new Writer(doc, fonts);
  w.text(input.clinic.name, { size: 11, bold: true, color: HARBOUR, after: 0 });
  w.text(input.clinic.address, { size: 9, color: MUTED, after: 10 });
  w.text(d.title, { size: 18, bold: true, after: 2 });
  w.text(`Consent text version ${d.templateVersion} · Consent ${input.consentId} · PDF version ${input.pdfVersion}`, { size: 9, color: MUTED, after: 6 });
  w.rule();

  w.heading("Your visit");
  d.visit.forEach((r) => w.row(r.label, r.value));

  for (const section of d.sections) {
    w.heading(section.heading);
    for (const block of section.blocks) {
      if (block.kind === "p") w.text(block.text);
      else block.items.forEach((item) => w.bullet(item));
    }
    w.text(input.acknowledgedAll ? "✓ Read and acknowledged by the patient." : "Not acknowledged.", { size: 9, color: MUTED, after: 2 });
  }

  w.heading(`${d.electronicRecords.heading} (version ${d.electronicRecords.version})`);
  d.electronicRecords.text.forEach((t) => w.text(t));
  w.text("✓ Agreed by the patient before signing.", { size: 9, color: MUTED });

  w.newPage();
  w.heading("Health questionnaire", 15);
  w.heading("Points for the dentist's attention", 12);
  if (input.flags.length === 0) w.text("None: the patient answered no to every question and added nothing.");
  input.flags.forEach((f) => w.flag(f));
  w.heading("Answers", 12);
  for (const a of input.answers) {
    w.text(a.question, { after: 0 });
    w.text(`Answer: ${a.answer}`, { bold: true, indent: 12, after: 4 });
  }

  w.heading("Signature", 15);
  w.text(`By signing, ${input.typedName} confirms having read each section above, having had the chance to ask questions, and agreeing to the treatment described.`);
  w.row("Typed name", input.typedName);
  w.row("Signed", input.signedAt);
  w.gap(4);
  w.image(signature, 260, 110);
  w.text("The portal informs; the dentist decides. This consent is confirmed with the patient chairside, and the dentist's judgment, local regulations and licensed practice prevail.", { size: 9, color: MUTED });

  w.newPage();
  w.heading("Audit trail", 15);
  w.text("Each event as recorded by the clinic's portal. Times are shown in the clinic's time zone and in UTC.", { size: 9, color: MUTED });
  for (const line of input.audit) {
    w.rule();
    w.row("Event", line.event);
    w.row("Who", line.who);
    w.row("When", line.at);
    w.row("IP address", line.ip);
    w.row("Device (user agent)", line.userAgent);
  }
  w.rule();
  w.heading("Fingerprints", 12);
  w.fingerprint("Consent text SHA-256", input.textSha256);
  if (input.previous) w.fingerprint(`PDF version ${input.previous.version} SHA-256`, input.previous.sha256);
  w.row("Consent text version", String(d.templateVersion));
  w.row("Records agreement", `version ${d.electronicRecords.version}`);
  w.row("Review", input.review ? `Reviewed by ${input.review.by}, ${input.review.at}` : "Not reviewed yet (the dentist reviews it before treatment starts).");
  w.gap(6);
  w.text(
    "This PDF carries the clinic's digital seal. A PDF reader shows whether the file was changed after sealing, and the clinic can check any copy against its records. Earlier versions of this PDF stay stored and verifiable.",
    { size: 9, color: MUTED },
  );

  const pages = doc.getPages();
  pages.forEach((page, i) => {
    const footer = clean(`${input.clinic.name} · Consent ${input.consentId} · PDF version ${input.pdfVersion} · Page ${i + 1} of ${pages.length}`);
    page.drawText(footer, { x: PAGE.margin, y: 32, size: 8, font: fonts.regular, color: MUTED });
  });
  return doc;
}
