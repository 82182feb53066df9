// Creates the clinic's self-signed document-seal certificate (a PKCS#12 file) for the demo and the
// tests. Keeps an existing file, so PDFs sealed earlier stay verifiable with the same certificate.
import { generateKeyPairSync } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import forge from "node-forge";

export const SEAL_COMMON_NAME = "Alder Bay Dental Studio — document seal (demo)";

export function ensureSealCertificate({ file, password, commonName = SEAL_COMMON_NAME }: { file: string; password: string; commonName?: string }): "created" | "kept" {
  if (existsSync(file)) {
    try {
      const p12 = forge.pkcs12.pkcs12FromAsn1(forge.asn1.fromDer(readFileSync(file).toString("binary")), password);
      const certs = p12.getBags({ bagType: forge.pki.oids.certBag })[forge.pki.oids.certBag] ?? [];
      if (!certs.length) throw new Error("no certificate inside");
      return "kept";
    } catch (err) {
      throw new Error(
        `${file} exists but cannot be opened with SEAL_CERT_PASSWORD (${err instanceof Error ? err.message : err}). ` +
          "Move it away to create a new one; PDFs sealed with the old one then no longer match this certificate.",
      );
    }
  }
  // Node generates the key (much faster than forge's pure-JS generator); forge builds the certificate.
  const { privateKey: pem } = generateKeyPairSync("rsa", {
    modulusLength: 2048,
    privateKeyEncoding: { type: "pkcs8", format: "pem" },
    publicKeyEncoding: { type: "spki", format: "pem" },
  });
  const key = forge.pki.privateKeyFromPem(pem) as forge.pki.rsa.PrivateKey;
  const cert = forge.pki.createCertificate();
  cert.publicKey = forge.pki.setRsaPublicKey(key.n, key.e);
  cert.serialNumber = "01" + forge.util.bytesToHex(forge.random.getBytesSync(15));
  cert.validity.notBefore = new Date(Date.now() - 24 * 3600 * 1000);
  cert.validity.notAfter = new Date(Date.now() + 10 * 365 * 24 * 3600 * 1000);
  const subject = [
    // forge encodes a UTF8String value itself (x509.js), so the name goes in as plain text.
    { name: "commonName", value: commonName, valueTagClass: forge.asn1.Type.UTF8 },
    { name: "organizationName", value: "Alder Bay Dental Studio (invented demo clinic)" },
    { name: "countryName", value: "CA" },
  ] as forge.pki.CertificateField[];
  cert.setSubject(subject);
  cert.setIssuer(subject);
  cert.setExtensions([
    { name: "basicConstraints", cA: false },
    { name: "keyUsage", digitalSignature: true, nonRepudiation: true },
    { name: "subjectKeyIdentifier" },
  ]);
  cert.sign(key, forge.md.sha256.create());
  const asn1 = forge.pkcs12.toPkcs12Asn1(key, [cert], password, { algorithm: "3des", friendlyName: "clinic-seal" });
  mkdirSync(path.dirname(file), { recursive: true });
  writeFileSync(file, Buffer.from(forge.asn1.toDer(asn1).getBytes(), "binary"), { mode: 0o600 });
  return "created";
}
