// Lays out a consent as a PDF (pdf-lib with the shipped DejaVu TTF fonts, so every name renders):
// the consent text, the visit, the questionnaire and flags, the signature, and an audit page.
// Returns the pdf-lib document unsaved, so the seal can add its placeholder before saving.
import { readFile } from "node:fs/promises";
import path from "node:path";
import fontkit from "@pdf-lib/fontkit";
import { createTranslator } from "next-intl";
import { PDFDocument, rgb, type PDFFont, type PDFImage, type PDFPage, type RGB } from "pdf-lib";
import type { ConsentFlag } from "@/lib/domain/consent-questionnaire";
import type { AssembledConsent } from "@/lib/domain/consent-text";
import { CONSENT_WORDS } from "@/lib/domain/consent-words";
import { messagesFor } from "@/lib/i18n/messages";

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
  // The PDF speaks the language the consent was signed in.
  const t = createTranslator({ locale: d.language, messages: messagesFor(d.language), namespace: "pdf" });

  doc.setTitle(`${d.title} — ${input.patientName}`, { showInWindowTitleBar: true });
  doc.setAuthor(input.clinic.name);
  doc.setSubject(t("subject", { id: input.consentId, version: input.pdfVersion }));
  doc.setKeywords(["consent", input.consentId, `template version ${d.templateVersion}`]);
  doc.setCreator("Cuspal");
  doc.setProducer("Cuspal");
  doc.setCreationDate(input.createdAt);
  doc.setModificationDate(input.createdAt);
  doc.setLanguage(d.language === "fr" ? "fr-CA" : "en-CA");

  const w = new Writer(doc, fonts);
  w.text(input.clinic.name, { size: 11, bold: true, color: HARBOUR, after: 0 });
  w.text(input.clinic.address, { size: 9, color: MUTED, after: 10 });
  w.text(d.title, { size: 18, bold: true, after: 2 });
  w.text(t("versionLine", { template: d.templateVersion, id: input.consentId, version: input.pdfVersion }), { size: 9, color: MUTED, after: 6 });
  w.rule();

  w.heading(t("yourVisit"));
  d.visit.forEach((r) => w.row(r.label, r.value));

  for (const section of d.sections) {
    w.heading(section.heading);
    for (const block of section.blocks) {
      if (block.kind === "p") w.text(block.text);
      else block.items.forEach((item) => w.bullet(item));
    }
    w.text(input.acknowledgedAll ? t("acknowledged") : t("notAcknowledged"), { size: 9, color: MUTED, after: 2 });
  }

  w.heading(`${d.electronicRecords.heading} ${CONSENT_WORDS[d.language].recordsVersion(d.electronicRecords.version)}`);
  d.electronicRecords.text.forEach((t) => w.text(t));
  w.text(t("agreed"), { size: 9, color: MUTED });

  w.newPage();
  w.heading(t("questionnaire"), 15);
  w.heading(t("attention"), 12);
  if (input.flags.length === 0) w.text(t("noFlags"));
  input.flags.forEach((f) => w.flag(f));
  w.heading(t("answers"), 12);
  for (const a of input.answers) {
    w.text(a.question, { after: 0 });
    w.text(t("answer", { answer: a.answer }), { bold: true, indent: 12, after: 4 });
  }

  w.heading(t("signature"), 15);
  w.text(t("bySigning", { name: input.typedName }));
  w.row(t("typedName"), input.typedName);
  w.row(t("signed"), input.signedAt);
  w.gap(4);
  w.image(signature, 260, 110);
  w.text(t("cautions"), { size: 9, color: MUTED });

  w.newPage();
  w.heading(t("audit"), 15);
  w.text(t("auditIntro"), { size: 9, color: MUTED });
  for (const line of input.audit) {
    w.rule();
    w.row(t("event"), line.event);
    w.row(t("who"), line.who);
    w.row(t("when"), line.at);
    w.row(t("ip"), line.ip);
    w.row(t("device"), line.userAgent);
  }
  w.rule();
  w.heading(t("fingerprints"), 12);
  w.fingerprint(t("textSha"), input.textSha256);
  if (input.previous) w.fingerprint(t("pdfSha", { version: input.previous.version }), input.previous.sha256);
  w.row(t("textVersion"), String(d.templateVersion));
  w.row(t("language"), `${CONSENT_WORDS[d.language].languageName} (${d.language})`);
  w.row(t("records"), t("recordsVersion", { version: d.electronicRecords.version }));
  w.row(t("review"), input.review ? t("reviewedBy", { name: input.review.by, at: input.review.at }) : t("notReviewed"));
  w.gap(6);
  w.text(
    t("seal"),
    { size: 9, color: MUTED },
  );

  const pages = doc.getPages();
  pages.forEach((page, i) => {
    const footer = clean(t("footer", { clinic: input.clinic.name, id: input.consentId, version: input.pdfVersion, page: i + 1, pages: pages.length }));
    page.drawText(footer, { x: PAGE.margin, y: 32, size: 8, font: fonts.regular, color: MUTED });
  });
  return doc;
}
