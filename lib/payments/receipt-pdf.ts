// A one-page PDF receipt for a deposit (and its refund, when there was one), laid out with pdf-lib
// and the shipped DejaVu TTF so every name and currency sign renders.
import { readFile } from "node:fs/promises";
import path from "node:path";
import fontkit from "@pdf-lib/fontkit";
import { PDFDocument, rgb } from "pdf-lib";

export type ReceiptInput = {
  clinic: { name: string; address: string; phone: string | null };
  patientName: string;
  receiptNumber: string;
  /** Lines already formatted for people (amounts through Intl.NumberFormat, times in the clinic's zone). */
  visitText: string;
  rows: [label: string, value: string][];
  issuedAt: Date;
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

export async function buildReceiptPdf(input: ReceiptInput): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.registerFontkit(fontkit);
  const [regularBytes, boldBytes] = await loadFonts();
  const regular = await doc.embedFont(regularBytes, { subset: true });
  const bold = await doc.embedFont(boldBytes, { subset: true });
  doc.setTitle(`Receipt ${input.receiptNumber} — ${input.clinic.name}`, { showInWindowTitleBar: true });
  doc.setAuthor(input.clinic.name);
  doc.setSubject(`Deposit receipt ${input.receiptNumber}`);
  doc.setCreator("Cuspal");
  doc.setProducer("Cuspal");
  doc.setCreationDate(input.issuedAt);
  doc.setModificationDate(input.issuedAt);
  doc.setLanguage("en");

  const page = doc.addPage([595.28, 841.89]); // A4 in points
  const ink = rgb(0.11, 0.16, 0.2);
  const muted = rgb(0.35, 0.4, 0.45);
  let y = 790;
  const line = (text: string, opts: { size?: number; font?: typeof regular; colour?: typeof ink; x?: number } = {}) => {
    page.drawText(text, { x: opts.x ?? 56, y, size: opts.size ?? 11, font: opts.font ?? regular, color: opts.colour ?? ink, maxWidth: 480 });
    y -= (opts.size ?? 11) * 1.6;
  };
  line(input.clinic.name, { size: 16, font: bold });
  line(input.clinic.address, { colour: muted });
  if (input.clinic.phone) line(input.clinic.phone, { colour: muted });
  y -= 16;
  line("Deposit receipt", { size: 20, font: bold });
  line(`Receipt number ${input.receiptNumber}`, { colour: muted });
  y -= 8;
  line(`Patient: ${input.patientName}`);
  line(`Visit: ${input.visitText}`);
  y -= 8;
  for (const [label, value] of input.rows) {
    page.drawText(label, { x: 56, y, size: 11, font: bold, color: ink });
    page.drawText(value, { x: 220, y, size: 11, font: regular, color: ink, maxWidth: 320 });
    y -= 20;
  }
  y -= 16;
  line("The deposit counts toward the fee of the visit. A dental-plan estimate is not the plan's decision:", { size: 9, colour: muted });
  line("the plan's own decision prevails.", { size: 9, colour: muted });
  return doc.save();
}
