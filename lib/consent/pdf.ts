// Lays out a consent as a PDF (pdf-lib with the shipped DejaVu TTF fonts, so every name renders):
// the consent text, the visit, the questionnaire and flags, the signature, and an audit page.
// This file holds what the PDF says; pdf-layout.ts holds how it is drawn. Returns the pdf-lib
// document unsaved, so the seal can add its placeholder before saving.
import { readFile } from "node:fs/promises";
import path from "node:path";
import fontkit from "@pdf-lib/fontkit";
import { createTranslator } from "next-intl";
import { PDFDocument } from "pdf-lib";
import sharp from "sharp";
import type { ConsentFlag } from "@/lib/domain/consent-questionnaire";
import type { AssembledConsent } from "@/lib/domain/consent-text";
import { CONSENT_WORDS } from "@/lib/domain/consent-words";
import { MAX_IMAGE_PIXELS } from "@/lib/domain/image-limits";
import { clipText, TEXT_LIMITS } from "@/lib/domain/text-limits";
import { messagesFor } from "@/lib/i18n/messages";
import { clean, HARBOUR, MUTED, PAGE, Writer } from "./pdf-layout";

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

let fontBytes: Promise<[Buffer, Buffer]> | undefined;
function loadFonts(): Promise<[Buffer, Buffer]> {
  // Literal paths, so the build traces only these two files.
  fontBytes ??= Promise.all([
    readFile(path.join(process.cwd(), "public/fonts/DejaVuSans.ttf")),
    readFile(path.join(process.cwd(), "public/fonts/DejaVuSans-Bold.ttf")),
  ]);
  return fontBytes;
}

// The signature box on the page is at most 260 × 110 pt; three pixels per point prints sharply.
const SIGNATURE_PIXELS = { width: 780, height: 330 };

/**
 * The drawn signature scaled to what the page shows. The stored PNG stays as drawn; the PDF gets
 * this copy because pdf-lib decodes and re-compresses an image in JavaScript, on the event loop,
 * while sharp works on its own threads.
 */
async function signatureForPage(png: Uint8Array): Promise<Buffer> {
  return sharp(png, { limitInputPixels: MAX_IMAGE_PIXELS })
    .resize({ ...SIGNATURE_PIXELS, fit: "inside", withoutEnlargement: true })
    .png()
    .toBuffer();
}

/** Lets other requests run between parts of a long layout, so one signing never holds the server. */
const breathe = () => new Promise<void>((resolve) => setImmediate(resolve));

const L = TEXT_LIMITS;
const cap = (text: string, max: number = L.line) => clipText(text, max);

/**
 * The one place every text that reaches the PDF is capped, whatever path it came by (a header,
 * an old row, a schema that changed): the layout's cost stays bounded by these lengths.
 */
export function limitPdfInput(input: ConsentPdfInput): ConsentPdfInput {
  const d = input.document;
  const section = (s: AssembledConsent["sections"][number]) => ({
    ...s,
    heading: cap(s.heading, L.sectionHeading),
    blocks: s.blocks.map((b) => (b.kind === "p" ? { ...b, text: cap(b.text, L.sectionBody) } : { ...b, items: b.items.map((i) => cap(i, L.sectionBody)) })),
  });
  return {
    ...input,
    consentId: cap(input.consentId, 64),
    clinic: { name: cap(input.clinic.name, L.clinicName), address: cap(input.clinic.address, L.address) },
    patientName: cap(input.patientName, L.email),
    document: {
      ...d,
      title: cap(d.title, L.templateTitle),
      visit: d.visit.map((r) => ({ label: cap(r.label, L.sectionHeading), value: cap(r.value) })),
      sections: d.sections.map(section),
      electronicRecords: { ...d.electronicRecords, heading: cap(d.electronicRecords.heading, L.sectionHeading), text: d.electronicRecords.text.map((t) => cap(t, L.sectionBody)) },
    },
    answers: input.answers.map((a) => ({ question: cap(a.question), answer: cap(a.answer, L.answer) })),
    flags: input.flags.map((f) => ({ ...f, label: cap(f.label), ...(f.detail !== undefined ? { detail: cap(f.detail, L.answer + 200) } : {}) })),
    typedName: cap(input.typedName, L.personName),
    signedAt: cap(input.signedAt, 200),
    textSha256: cap(input.textSha256, 64),
    audit: input.audit.map((a) => ({
      event: cap(a.event, 200), who: cap(a.who, L.email + 40), at: cap(a.at, 200), ip: cap(a.ip, L.ip), userAgent: cap(a.userAgent, L.userAgent),
    })),
    review: input.review ? { by: cap(input.review.by, L.email), at: cap(input.review.at, 200) } : null,
    previous: input.previous ? { version: input.previous.version, sha256: cap(input.previous.sha256, 64) } : null,
  };
}

export async function buildConsentPdf(raw: ConsentPdfInput): Promise<PDFDocument> {
  const input = limitPdfInput(raw);
  const doc = await PDFDocument.create();
  doc.registerFontkit(fontkit);
  const [regularBytes, boldBytes] = await loadFonts();
  const fonts = { regular: await doc.embedFont(regularBytes, { subset: true }), bold: await doc.embedFont(boldBytes, { subset: true }) };
  const signature = await doc.embedPng(await signatureForPage(input.signaturePng));
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
    await breathe();
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
  for (const f of input.flags) {
    w.flag({ level: f.level, tag: f.level === "alert" ? t("alertTag") : t("checkTag"), body: f.detail ? `${f.label}. ${f.detail}` : f.label });
  }
  w.heading(t("answers"), 12);
  await breathe();
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
  await breathe();
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
  w.row("Review", input.review ? t("reviewedBy", { name: input.review.by, at: input.review.at }) : t("notReviewed"));
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
