// Seals a consent PDF with the clinic's certificate: a standard PDF digital signature, PAdES
// baseline B-B (SubFilter ETSI.CAdES.detached), so any PDF reader or validator (poppler's pdfsig,
// OpenSSL's cms) shows whether the file changed after sealing. The one function that seals; its
// output's SHA-256 is what we store.
import { createPrivateKey, type KeyObject } from "node:crypto";
import { readFile } from "node:fs/promises";
import signpdf, { Signer } from "@signpdf/signpdf";
import forge from "node-forge";
import { PDFArray, PDFHexString, PDFInvalidObject, PDFName, PDFNumber, PDFString, type PDFDict, type PDFDocument } from "pdf-lib";
import { cadesDetachedSignature, parseSealCertificate, type SealCertificate } from "./cms";

type SealKey = { cert: SealCertificate; key: KeyObject };

let cached: { path: string; key: Promise<SealKey> } | undefined;

/** The certificate and private key inside a PKCS#12 file. */
export function readSealKey(p12Der: Buffer, passphrase: string): SealKey {
  const p12 = forge.pkcs12.pkcs12FromAsn1(forge.asn1.fromDer(p12Der.toString("binary")), passphrase);
  const certBag = p12.getBags({ bagType: forge.pki.oids.certBag })[forge.pki.oids.certBag]?.[0];
  const keyBag =
    p12.getBags({ bagType: forge.pki.oids.pkcs8ShroudedKeyBag })[forge.pki.oids.pkcs8ShroudedKeyBag]?.[0] ??
    p12.getBags({ bagType: forge.pki.oids.keyBag })[forge.pki.oids.keyBag]?.[0];
  if (!certBag?.cert || !keyBag?.key) throw new Error("The clinic seal file holds no certificate or no private key.");
  // certificateToAsn1 reuses the certificate's parsed TBS part, so these are the issued bytes.
  const certDer = Buffer.from(forge.asn1.toDer(forge.pki.certificateToAsn1(certBag.cert)).getBytes(), "binary");
  return { cert: parseSealCertificate(certDer), key: createPrivateKey(forge.pki.privateKeyToPem(keyBag.key)) };
}

function sealKey(): Promise<SealKey> {
  const file = process.env.SEAL_CERT_PATH;
  const passphrase = process.env.SEAL_CERT_PASSWORD;
  if (!file || !passphrase) {
    throw new Error("The clinic seal certificate is not configured: set SEAL_CERT_PATH and SEAL_CERT_PASSWORD (npm run demo does), then run `tsx scripts/make-seal-certificate.ts`.");
  }
  if (cached?.path !== file) {
    const key = readFile(file).then(
      (bytes) => readSealKey(bytes, passphrase),
      (err: NodeJS.ErrnoException) => {
        throw new Error(err.code === "ENOENT" ? `The clinic seal certificate ${file} is missing: run \`tsx scripts/make-seal-certificate.ts\`.` : err.message);
      },
    );
    key.catch(() => (cached = undefined));
    cached = { path: file, key };
  }
  return cached.key;
}

class CadesSigner extends Signer {
  constructor(private readonly sealKey: SealKey) {
    super();
  }

  async sign(signedBytes: Buffer): Promise<Buffer> {
    return cadesDetachedSignature(signedBytes, this.sealKey.cert, this.sealKey.key);
  }
}

export type SealInfo = { reason: string; clinicName: string; location: string; contact: string; at: Date };

// The byte range and contents are filled in by @signpdf after saving; its placeholder name.
const BYTE_RANGE_PLACEHOLDER = "**********";
// Bytes reserved for the CMS (a 2048-bit RSA certificate and signature take about 2 kB).
const SIGNATURE_BYTES = 8192;
const SIG_FLAGS = { SIGNATURES_EXIST: 1, APPEND_ONLY: 2 };
const PRINT_FLAG = 4;

/**
 * Adds an invisible signature field whose value is the signature dictionary, with texts written
 * as UTF-16 strings so accented names survive (a PDF literal string would be read as PDFDocEncoding).
 */
function addSealPlaceholder(doc: PDFDocument, info: SealInfo) {
  const page = doc.getPages()[0];
  const placeholder = PDFName.of(BYTE_RANGE_PLACEHOLDER);
  const signature = doc.context.obj({
    Type: "Sig",
    Filter: "Adobe.PPKLite",
    SubFilter: "ETSI.CAdES.detached",
    ByteRange: [PDFNumber.of(0), placeholder, placeholder, placeholder],
    Contents: PDFHexString.of("00".repeat(SIGNATURE_BYTES)),
    Reason: PDFHexString.fromText(info.reason),
    M: PDFString.fromDate(info.at),
    ContactInfo: PDFHexString.fromText(info.contact),
    Name: PDFHexString.fromText(info.clinicName),
    Location: PDFHexString.fromText(info.location),
    Prop_Build: { App: { Name: "Cuspal" } },
  });
  // Written as raw bytes, so pdf-lib never moves it into a compressed object stream.
  const bytes = new Uint8Array(signature.sizeInBytes());
  signature.copyBytesInto(bytes, 0);
  const signatureRef = doc.context.register(PDFInvalidObject.of(bytes));
  const appearance = doc.context.register(doc.context.formXObject([], { BBox: [0, 0, 0, 0], Resources: {} }));
  const widget = doc.context.register(doc.context.obj({
    Type: "Annot", Subtype: "Widget", FT: "Sig", Rect: [0, 0, 0, 0], V: signatureRef,
    T: PDFHexString.fromText("Clinic seal"), F: PRINT_FLAG, P: page.ref, AP: { N: appearance },
  }));
  const annots = page.node.lookupMaybe(PDFName.of("Annots"), PDFArray) ?? doc.context.obj([]);
  annots.push(widget);
  page.node.set(PDFName.of("Annots"), annots);
  const acroForm = doc.context.obj({ Fields: [widget], SigFlags: SIG_FLAGS.SIGNATURES_EXIST | SIG_FLAGS.APPEND_ONLY }) as PDFDict;
  doc.catalog.set(PDFName.of("AcroForm"), doc.context.register(acroForm));
}

/** Saves the document with a signature placeholder and fills it with the clinic's seal. */
export async function sealPdf(doc: PDFDocument, info: SealInfo): Promise<Buffer> {
  const key = await sealKey();
  addSealPlaceholder(doc, info);
  // The placeholder must sit in a plain (not compressed) object for the byte ranges to be found.
  const unsigned = await doc.save({ useObjectStreams: false });
  return signpdf.sign(Buffer.from(unsigned), new CadesSigner(key));
}
