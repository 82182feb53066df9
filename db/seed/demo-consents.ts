// Demo consents: the clinic's default consent text (version 1), and Tobias Renfrew's visit today
// signed and sealed yesterday evening, waiting for the dentist's chairside review. The demo
// patient's upcoming visit and Marisol Akande's visit today still need their consent.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { randomBytes } from "node:crypto";
import path from "node:path";
import sharp from "sharp";
import type { Transaction } from "sequelize";
import { AuditEvent, type Appointment } from "@/db/models";
import { ensureLiveConsent, issuePdf, loadVisitContext, publishedTemplate, recordSignature } from "@/lib/consent/record";
import { ensureSealCertificate } from "@/lib/consent/seal-certificate";
import { QUESTION_KEYS, type QuestionnaireAnswers } from "@/lib/domain/consent-questionnaire";
import { SECTION_KEYS } from "@/lib/domain/consent-text";

type DemoVisits = { zoeUpcoming: Appointment; tobiasToday: Appointment; marisolToday: Appointment; henrikRequested: Appointment };

const HOUR = 3600_000;
const PHONE_UA = "Mozilla/5.0 (Linux; Android 14; Pixel 7) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0 Mobile Safari/537.36";

/** Running the seed by hand (without `npm run demo`) uses the same certificate place the demo set-up uses. */
function ensureDemoSealCertificate() {
  const dataDir = path.join(process.cwd(), ".data");
  if (!process.env.SEAL_CERT_PATH) process.env.SEAL_CERT_PATH = path.join(dataDir, "seal", "clinic-seal.p12");
  if (!process.env.SEAL_CERT_PASSWORD) {
    const secret = path.join(dataDir, "seal.secret");
    mkdirSync(dataDir, { recursive: true });
    if (!existsSync(secret)) writeFileSync(secret, randomBytes(32).toString("base64url"), { mode: 0o600 });
    process.env.SEAL_CERT_PASSWORD = readFileSync(secret, "utf8").trim();
  }
  ensureSealCertificate({ file: process.env.SEAL_CERT_PATH, password: process.env.SEAL_CERT_PASSWORD });
}

/** An invented signature, drawn as a few strokes and rasterised like a phone canvas would. */
async function demoSignature(): Promise<Buffer> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="680" height="220">
    <path d="M40 150 C 60 60, 95 40, 110 70 S 90 170, 130 160 S 170 80, 190 110 S 215 170, 240 130
             S 280 70, 300 120 S 330 170, 360 120 C 380 90, 400 100, 410 130 S 450 160, 480 110
             S 530 60, 560 120 S 600 150, 640 100" stroke="#1f2a37" stroke-width="4" fill="none" stroke-linecap="round"/>
    <path d="M300 175 C 380 165, 470 170, 600 160" stroke="#1f2a37" stroke-width="3" fill="none" stroke-linecap="round"/>
  </svg>`;
  return sharp(Buffer.from(svg)).png().toBuffer();
}

export async function seedConsents(visits: DemoVisits, transaction: Transaction, now: Date) {
  ensureDemoSealCertificate();
  const visit = visits.tobiasToday;
  const template = await publishedTemplate(visit.clinicId, transaction);
  const ctx = await loadVisitContext(visit, transaction);
  const signedAt = new Date(now.getTime() - 14 * HOUR);
  const consent = await ensureLiveConsent(visit, transaction);
  // He opened the consent twice before signing it on his phone.
  for (const hoursBefore of [26, 0.25]) {
    await AuditEvent.create(
      {
        clinicId: visit.clinicId, actorUserId: ctx.patientUser.id, action: "consent.viewed", subjectType: "consent", subjectId: consent.id,
        at: new Date(signedAt.getTime() - hoursBefore * HOUR), ip: "192.0.2.44", userAgent: PHONE_UA, data: { appointmentId: visit.id, templateVersion: template.version },
      },
      { transaction },
    );
  }
  const answers: QuestionnaireAnswers = {
    ...(Object.fromEntries(QUESTION_KEYS.map((k) => [k, "no"])) as Record<(typeof QUESTION_KEYS)[number], "no">),
    medicineAnticoagulants: "yes",
    grinding: "unsure",
    otherAllergies: "",
    medicines: "A daily low-dose blood thinner after a knee operation.",
    notes: "",
  };
  await recordSignature(consent, ctx, {
    template, answers, acknowledged: [...SECTION_KEYS], typedName: ctx.patientUser.name ?? "Tobias Renfrew",
    signaturePng: await demoSignature(), at: signedAt, ip: "192.0.2.44", userAgent: PHONE_UA, actorUserId: ctx.patientUser.id,
  }, transaction);
  await issuePdf(consent, ctx, "signed", transaction);
  return { tobiasConsent: consent };
}
