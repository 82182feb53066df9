// `tsx scripts/make-seal-certificate.ts`: creates the clinic's document-seal certificate at
// SEAL_CERT_PATH (protected by SEAL_CERT_PASSWORD) unless it is already there. Run by
// `npm run demo` and `npm test` after the migrations.
import path from "node:path";
import { ensureSealCertificate } from "../lib/consent/seal-certificate";

const file = process.env.SEAL_CERT_PATH;
const password = process.env.SEAL_CERT_PASSWORD;
if (!file || !password) {
  console.error("SEAL_CERT_PATH and SEAL_CERT_PASSWORD must be set (npm run demo and npm test set them).");
  process.exit(1);
}
try {
  const result = ensureSealCertificate({ file, password });
  console.log(`Clinic seal certificate ${result}: ${path.relative(process.cwd(), file)}`);
} catch (err) {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
}
