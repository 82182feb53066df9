// Creates the clinic's document-seal certificate for the demo and the tests: a self-signed
// certificate in a PKCS#12 file at SEAL_CERT_PATH, protected by SEAL_CERT_PASSWORD. Keeps an
// existing file, so sealed PDFs stay verifiable with the same certificate across restarts.
import { generateKeyPairSync } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import forge from "node-forge";

const COMMON_NAME = "Alder Bay Dental Studio — document seal (demo)";

function fail(message: string): never {
  console.error(message);
  process.exit(1);
}

const file = process.env.SEAL_CERT_PATH;
const password = process.env.SEAL_CERT_PASSWORD;
if (!file || !password) fail("SEAL_CERT_PATH and SEAL_CERT_PASSWORD must be set (npm run demo and npm test set them).");

if (existsSync(file)) {
  try {
    const p12 = forge.pkcs12.pkcs12FromAsn1(forge.asn1.fromDer(readFileSync(file).toString("binary")), password);
    const certs = p12.getBags({ bagType: forge.pki.oids.certBag })[forge.pki.oids.certBag] ?? [];
    if (!certs.length) throw new Error("no certificate inside");
    console.log(`Clinic seal certificate kept: ${path.relative(process.cwd(), file)}`);
    process.exit(0);
  } catch (err) {
    fail(`${file} exists but cannot be opened with SEAL_CERT_PASSWORD (${err instanceof Error ? err.message : err}). Move it away to create a new one; PDFs sealed with the old one then no longer match this certificate.`);
  }
}

// Node generates the key (much faster than forge's pure-JS generator); forge builds the certificate.
const { privateKey: pem } = generateKeyPairSync("rsa", { modulusLength: 2048, privateKeyEncoding: { type: "pkcs8", format: "pem" }, publicKeyEncoding: { type: "spki", format: "pem" } });
const key = forge.pki.privateKeyFromPem(pem) as forge.pki.rsa.PrivateKey;
const cert = forge.pki.createCertificate();
cert.publicKey = forge.pki.setRsaPublicKey(key.n, key.e);
cert.serialNumber = "01" + forge.util.bytesToHex(forge.random.getBytesSync(15));
cert.validity.notBefore = new Date(Date.now() - 24 * 3600 * 1000);
cert.validity.notAfter = new Date(Date.now() + 10 * 365 * 24 * 3600 * 1000);
const subject = [
  // forge encodes a UTF8String value itself (x509.js), so the name goes in as plain text.
  { name: "commonName", value: COMMON_NAME, valueTagClass: forge.asn1.Type.UTF8 },
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
console.log(`Clinic seal certificate created: ${path.relative(process.cwd(), file)}`);
