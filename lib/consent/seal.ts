// Seals a consent PDF with the clinic's certificate: a standard PDF digital signature (PKCS#7
// detached, adbe.pkcs7.detached) made with @signpdf, so any PDF reader shows whether the file
// changed after sealing. The one function that seals; its output's SHA-256 is what we store.
import { readFile } from "node:fs/promises";
import { pdflibAddPlaceholder } from "@signpdf/placeholder-pdf-lib";
import { P12Signer } from "@signpdf/signer-p12";
import signpdf from "@signpdf/signpdf";
import type { PDFDocument } from "pdf-lib";

let cached: { path: string; p12: Promise<Buffer> } | undefined;

function certificate(): { p12: Promise<Buffer>; passphrase: string } {
  const file = process.env.SEAL_CERT_PATH;
  const passphrase = process.env.SEAL_CERT_PASSWORD;
  if (!file || !passphrase) {
    throw new Error("The clinic seal certificate is not configured: set SEAL_CERT_PATH and SEAL_CERT_PASSWORD (npm run demo does), then run `tsx scripts/make-seal-certificate.ts`.");
  }
  if (cached?.path !== file) {
    const p12 = readFile(file).catch((err: NodeJS.ErrnoException) => {
      cached = undefined;
      throw new Error(err.code === "ENOENT" ? `The clinic seal certificate ${file} is missing: run \`tsx scripts/make-seal-certificate.ts\`.` : err.message);
    });
    cached = { path: file, p12 };
  }
  return { p12: cached.p12, passphrase };
}

export type SealInfo = { reason: string; clinicName: string; location: string; contact: string; at: Date };

/** Saves the document with a signature placeholder and fills it with the clinic's seal. */
export async function sealPdf(doc: PDFDocument, info: SealInfo): Promise<Buffer> {
  const { p12, passphrase } = certificate();
  pdflibAddPlaceholder({
    pdfDoc: doc,
    reason: info.reason,
    name: info.clinicName,
    location: info.location,
    contactInfo: info.contact,
    signingTime: info.at,
    appName: "Cuspal",
  });
  // The placeholder must sit in a plain (not compressed) object for the byte ranges to be found.
  const unsigned = await doc.save({ useObjectStreams: false });
  const signer = new P12Signer(await p12, { passphrase });
  return signpdf.sign(Buffer.from(unsigned), signer, info.at);
}
