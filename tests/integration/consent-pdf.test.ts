// The sealed consent PDF checked with outside tools: pdfjs-dist reads the text back (names with
// accents, tooth, material, template version, audit page), pdf-lib finds the embedded signature
// image, and node-forge with Node's crypto verifies the PKCS#7 seal over the signed byte ranges.
import { createVerify, createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import forge from "node-forge";
import { PDFDocument, PDFName, PDFRawStream } from "pdf-lib";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { Appointment, Consent, ConsentPdf } from "@/db/models";
import { openConsentForPatient, reviewConsent, signConsent } from "@/lib/data/consents";
import { QUESTION_KEYS, type QuestionnaireAnswers } from "@/lib/domain/consent-questionnaire";
import { SECTION_KEYS } from "@/lib/domain/consent-text";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";
import { sessionOf } from "../support/session";

const NAME = "Zoë Łukasiewicz-Núñez";
const UA = "Mozilla/5.0 (iPhone; CPU iPhone OS 18_0 like Mac OS X) ConsentPdfTest";

let t: TestClinic;
let v1: Buffer;
let v2: Buffer;
let consent: Consent;
let signatureSize: { width: number; height: number };


beforeAll(async () => {
  t = await createTestClinic({ timeZone: "America/Toronto" });
  const { user, patient } = await createTestPatient(t.clinic.id, NAME);
  const proposal = await createTestProposal(t, patient.id, { tooth: 36 });
  const startsAt = new Date(Date.now() + 5 * 24 * 3600 * 1000);
  const visit = await Appointment.create({
    clinicId: t.clinic.id, proposalId: proposal.id, patientId: patient.id, dentistId: t.staff.dentist.id,
    materialId: t.materialByKey["lithium-disilicate"].id, mode: "refined", tooth: 36, status: "confirmed", startsAt,
    endsAt: new Date(startsAt.getTime() + 150 * 60_000), chairId: t.equipment.find((e) => e.kind === "chair")!.id,
    millId: t.equipment.find((e) => e.kind === "mill")!.id, furnaceId: null, feeCents: 145000, createdBy: null,
  });
  const patientUser = sessionOf(user);
  const view = (await openConsentForPatient({ user: patientUser, appointmentId: visit.id, ip: "198.51.100.23", userAgent: UA }))!;
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="640" height="220"><path d="M30 160 C 90 20, 140 30, 180 150 S 290 60, 330 130 S 460 40, 600 110" stroke="#0b1f3a" stroke-width="6" fill="none"/></svg>`;
  const png = await sharp(Buffer.from(svg)).png().toBuffer();
  signatureSize = { width: 640, height: 220 };
  const answers = {
    ...(Object.fromEntries(QUESTION_KEYS.map((k) => [k, "no"])) as Record<(typeof QUESTION_KEYS)[number], "no">),
    allergyMethacrylates: "yes", conditionPregnancy: "unsure", otherAllergies: "", medicines: "Levothyroxine", notes: "",
  } as QuestionnaireAnswers;
  const signed = await signConsent({
    user: patientUser, ip: "198.51.100.23", userAgent: UA,
    input: {
      appointmentId: visit.id, templateId: view.form!.templateId, textSha256: view.form!.textSha256, answers,
      acknowledged: [...SECTION_KEYS], electronicRecords: true, typedName: "zoe lukasiewicz-nunez", signature: `data:image/png;base64,${png.toString("base64")}`,
    },
  });
  v1 = signed.pdf;
  await reviewConsent({ user: sessionOf(t.staff.dentist), consentId: signed.consentId, ip: "10.1.2.3", userAgent: "ChairsideTablet/2.0" });
  v2 = (await ConsentPdf.findOne({ where: { consentId: signed.consentId, version: 2 } }))!.pdf;
  consent = (await Consent.findByPk(signed.consentId))!;
});

async function pdfText(bytes: Buffer): Promise<{ pages: string[]; all: string }> {
  const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
  const doc = await pdfjs.getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  const pages: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    pages.push(content.items.map((item) => ("str" in item ? item.str + (item.hasEOL ? "\n" : " ") : "")).join(""));
  }
  await doc.destroy();
  return { pages, all: pages.join("\n") };
}

/**
 * Verifies the PDF's last signature independently of the code that made it: the digest of the
 * bytes the /ByteRange covers must equal the signed messageDigest attribute, and the RSA signature
 * over the DER of the signed attributes must verify with the certificate inside the PKCS#7.
 */
function verifySeal(pdf: Buffer): { digestOk: boolean; signatureOk: boolean; signer: string; certDer: string; signatureHex: string } {
  const text = pdf.toString("latin1");
  const ranges = [...text.matchAll(/\/ByteRange\s*\[\s*(\d+)\s+(\d+)\s+(\d+)\s+(\d+)\s*\]/g)];
  const [a, b, c, d] = ranges[ranges.length - 1].slice(1).map(Number);
  expect(a).toBe(0);
  expect(c + d).toBe(pdf.length); // the seal covers the whole file except its own contents
  const signedBytes = Buffer.concat([pdf.subarray(a, a + b), pdf.subarray(c, c + d)]);
  // /Contents is the DER in hex, padded with zeros to the placeholder's size.
  const der = Buffer.from(pdf.subarray(a + b + 1, c - 1).toString("latin1"), "hex");
  // forge accepts an options object here; its type declarations only know the older boolean.
  const fromDer = forge.asn1.fromDer as unknown as (bytes: forge.util.ByteStringBuffer, options: { parseAllBytes: boolean }) => forge.asn1.Asn1;
  const asn1 = fromDer(forge.util.createBuffer(der.toString("binary")), { parseAllBytes: false });
  const content = (asn1.value as forge.asn1.Asn1[])[1].value as forge.asn1.Asn1[];
  const signedData = content[0].value as forge.asn1.Asn1[];
  const certs = signedData.find((n) => n.tagClass === forge.asn1.Class.CONTEXT_SPECIFIC && n.type === 0)!.value as forge.asn1.Asn1[];
  const cert = forge.pki.certificateFromAsn1(certs[0]);
  const signerInfos = signedData[signedData.length - 1].value as forge.asn1.Asn1[];
  const signerInfo = signerInfos[0].value as forge.asn1.Asn1[];
  const attrsNode = signerInfo.find((n) => n.tagClass === forge.asn1.Class.CONTEXT_SPECIFIC && n.type === 0)!;
  const signature = Buffer.from(signerInfo.find((n) => n.tagClass === forge.asn1.Class.UNIVERSAL && n.type === forge.asn1.Type.OCTETSTRING)!.value as string, "binary");
  // The messageDigest attribute, OID 1.2.840.113549.1.9.4 (PKCS #9).
  let messageDigest = "";
  for (const attr of attrsNode.value as forge.asn1.Asn1[]) {
    const [oid, values] = attr.value as forge.asn1.Asn1[];
    if (forge.asn1.derToOid(oid.value as string) === "1.2.840.113549.1.9.4") {
      messageDigest = Buffer.from((values.value as forge.asn1.Asn1[])[0].value as string, "binary").toString("hex");
    }
  }
  // Signed attributes are signed as an explicit SET OF (RFC 5652 §5.4), not with their [0] tag.
  const attrsDer = forge.asn1.toDer(forge.asn1.create(forge.asn1.Class.UNIVERSAL, forge.asn1.Type.SET, true, attrsNode.value as forge.asn1.Asn1[])).getBytes();
  const verifier = createVerify("sha256");
  verifier.update(Buffer.from(attrsDer, "binary"));
  const publicKeyPem = forge.pki.publicKeyToPem(cert.publicKey);
  return {
    digestOk: messageDigest === createHash("sha256").update(signedBytes).digest("hex"),
    signatureOk: verifier.verify(publicKeyPem, signature),
    signer: forge.util.decodeUtf8(String(cert.subject.getField("CN")?.value ?? "")),
    certDer: forge.asn1.toDer(forge.pki.certificateToAsn1(cert)).toHex(),
    signatureHex: signature.toString("hex"),
  };
}

describe("sealed consent PDF", () => {
  it("reads back with the patient's accented name, the tooth, the material and the template version", async () => {
    const { all } = await pdfText(v1);
    expect(all).toContain(NAME);
    expect(all).toContain("36 (Universal 19) — lower left first molar");
    expect(all).toContain("Lithium disilicate (ISO 6872 class 3)");
    expect(all).toContain("refined");
    expect(all).toContain("Consent text version 1");
    expect(all).toMatch(/Agreement to sign and receive records electronically/);
    // The material's cautions come from the chosen material.
    expect(all).toContain(t.materialByKey["lithium-disilicate"].cautions[0].slice(0, 30));
  });

  it("holds the questionnaire answers, the flags and the signature", async () => {
    const { all } = await pdfText(v1);
    expect(all).toMatch(/ALERT\s+Methacrylate or resin allergy/);
    expect(all).toMatch(/CHECK\s+Pregnant or may be pregnant/);
    expect(all).toContain("Levothyroxine");
    expect(all).toContain("zoe lukasiewicz-nunez");
  });

  it("ends with an audit page: opened, signed (who, when, IP, device), and on version 2 reviewed", async () => {
    const first = await pdfText(v1);
    const audit = first.pages[first.pages.length - 1];
    expect(audit).toContain("Audit trail");
    expect(audit).toContain("Consent opened by the patient");
    expect(audit).toContain("Consent signed by the patient");
    expect(audit).toContain(`${NAME} (patient)`);
    expect(audit).toContain("198.51.100.23");
    expect(audit).toContain("ConsentPdfTest");
    expect(audit).toContain(consent.signedAt!.toISOString());
    expect(audit).toContain(consent.textSha256!);
    expect(audit).not.toContain("Consent reviewed by the dentist");

    const second = await pdfText(v2);
    const audit2 = second.pages[second.pages.length - 1];
    expect(audit2).toContain("Consent reviewed by the dentist");
    expect(audit2).toContain("Test dentist (dentist)");
    expect(audit2).toContain("10.1.2.3");
    expect(audit2).toContain("ChairsideTablet/2.0");
    expect(audit2).toContain(createHash("sha256").update(v1).digest("hex")); // the earlier version's fingerprint
    expect(second.all).toContain("PDF version 2");
  });

  it("embeds the drawn signature as an image", async () => {
    const doc = await PDFDocument.load(v1);
    const images = doc.context
      .enumerateIndirectObjects()
      .map(([, obj]) => obj)
      .filter((obj): obj is PDFRawStream => obj instanceof PDFRawStream && obj.dict.get(PDFName.of("Subtype")) === PDFName.of("Image"));
    const sizes = images.map((img) => ({ width: Number(img.dict.get(PDFName.of("Width"))?.toString()), height: Number(img.dict.get(PDFName.of("Height"))?.toString()) }));
    expect(sizes).toContainEqual(signatureSize);
    // And a page draws it: pdfjs reports an image painting operation.
    const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
    const loaded = await pdfjs.getDocument({ data: new Uint8Array(v1) }).promise;
    let painted = 0;
    for (let i = 1; i <= loaded.numPages; i++) {
      const ops = await (await loaded.getPage(i)).getOperatorList();
      painted += ops.fnArray.filter((fn) => fn === pdfjs.OPS.paintImageXObject).length;
    }
    await loaded.destroy();
    expect(painted).toBe(1);
  });

  it("carries a valid seal by the clinic's certificate, and one changed byte breaks it", () => {
    for (const pdf of [v1, v2]) {
      const seal = verifySeal(pdf);
      expect(seal).toMatchObject({ digestOk: true, signatureOk: true, signer: "Alder Bay Dental Studio — document seal (demo)" });
      // The certificate in the seal is the one in the clinic's PKCS#12 file.
      const p12 = forge.pkcs12.pkcs12FromAsn1(forge.asn1.fromDer(readFileSync(process.env.SEAL_CERT_PATH!).toString("binary")), process.env.SEAL_CERT_PASSWORD!);
      const bag = p12.getBags({ bagType: forge.pki.oids.certBag })[forge.pki.oids.certBag]![0];
      expect(seal.certDer).toBe(forge.asn1.toDer(forge.pki.certificateToAsn1(bag.cert!)).toHex());
    }
    // Change one byte of the sealed content: the digest no longer matches.
    const changed = Buffer.from(v1);
    const firstRange = [...changed.toString("latin1").matchAll(/\/ByteRange\s*\[\s*0\s+(\d+)/g)].pop()!;
    changed[Math.floor(Number(firstRange[1]) / 2)] ^= 0x01;
    expect(verifySeal(changed).digestOk).toBe(false);
    // Change one byte of the RSA signature value itself: the signature check fails.
    const forged = Buffer.from(v1);
    const sigHex = verifySeal(v1).signatureHex;
    const text = forged.toString("latin1");
    const found = text.indexOf(sigHex) >= 0 ? text.indexOf(sigHex) : text.indexOf(sigHex.toUpperCase());
    expect(found).toBeGreaterThan(0);
    const pos = found + 100;
    forged[pos] = forged[pos] === "0".charCodeAt(0) ? "1".charCodeAt(0) : "0".charCodeAt(0);
    const result = verifySeal(forged);
    expect(result.digestOk).toBe(true);
    expect(result.signatureOk).toBe(false);
  });

  it("stores each version's SHA-256 over its exact bytes", async () => {
    const rows = await ConsentPdf.findAll({ where: { consentId: consent.id }, order: [["version", "ASC"]] });
    expect(rows.map((r) => r.version)).toEqual([1, 2]);
    expect(rows[0].sha256).toBe(createHash("sha256").update(v1).digest("hex"));
    expect(rows[1].sha256).toBe(createHash("sha256").update(v2).digest("hex"));
    expect(rows[0].contentSha256).not.toBe(rows[0].sha256);
  });
});
