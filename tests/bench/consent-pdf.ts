// The sealed consent PDF for the worst input the schemas allow (every free text at its cap, long
// unbroken words, every question flagged, the longest template), and the health check's latency
// while a consent is signed. The signing runs in this process with the route's own health
// handler polled beside it: one Node process, one event loop, as behind `next start`.
import { mkdirSync } from "node:fs";
import path from "node:path";
import { performance } from "node:perf_hooks";
import sharp from "sharp";
import { Appointment, Consent, ConsentTemplate, sequelize } from "@/db/models";
import { buildConsentPdf, type ConsentPdfInput } from "@/lib/consent/pdf";
import { ensureLiveConsent, issuePdf, loadVisitContext, recordSignature } from "@/lib/consent/record";
import { sealPdf } from "@/lib/consent/seal";
import { ensureSealCertificate } from "@/lib/consent/seal-certificate";
import { decodeSignature } from "@/lib/consent/signature";
import { questionnaireFlags, answerLines, QUESTION_KEYS, type QuestionnaireAnswers } from "@/lib/domain/consent-questionnaire";
import { assembleConsent, crownWording, SECTION_KEYS, type TemplateSection } from "@/lib/domain/consent-text";
import { TEXT_LIMITS as L } from "@/lib/domain/text-limits";
import { createTestClinic, createTestPatient, createTestProposal } from "../support/fixtures";
import { ensureDatabase, ms, root, run as runCommand, stats } from "./support";

const TARGET_MS = 300;
const RUNS = 10;

/** Text of exactly `n` characters: words of 1 to 12 letters (some accented), like a long paragraph. */
function prose(n: number, seed = 1): string {
  const letters = "abcdefghijklmnopqrstuvwxyzéèàüöñçł";
  let s = "";
  let x = seed;
  while (s.length < n) {
    x = (x * 1103515245 + 12345) % 2 ** 31;
    const len = 1 + (x % 12);
    let word = "";
    for (let i = 0; i < len; i++) word += letters[(x >> (i + 3)) % letters.length];
    s += (s ? " " : "") + word;
  }
  return s.slice(0, n);
}

/** One unbroken word of `n` characters: the worst case for line breaking. */
const word = (n: number) => "Wq9é".repeat(Math.ceil(n / 4)).slice(0, n);

function worstTemplate(): { title: string; sections: TemplateSection[] } {
  return {
    title: word(L.templateTitle),
    sections: SECTION_KEYS.map((key, i) => ({
      key,
      heading: prose(L.sectionHeading, i + 7),
      // Paragraphs and a list, up to the body's cap, with one unbroken word in each.
      body: `${word(400)}\n\n${prose(L.sectionBody - 2000 - 404, i + 1)}\n\n${Array.from({ length: 10 }, (_, k) => `- ${prose(196, i * 10 + k)}`).join("\n")}`.slice(0, L.sectionBody),
    })),
  };
}

function worstAnswers(): QuestionnaireAnswers {
  return {
    ...(Object.fromEntries(QUESTION_KEYS.map((k) => [k, "yes"])) as Record<(typeof QUESTION_KEYS)[number], "yes">),
    otherAllergies: word(L.otherAllergies),
    medicines: word(L.answer),
    notes: word(L.answer),
  };
}

/** The largest drawing the signature check accepts: a 3000 × 1000 canvas. */
async function signaturePng(): Promise<Buffer> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="3000" height="1000"><path d="M100 750 C 400 100, 650 150, 825 700 S 1350 275, 1550 600 S 2150 175, 2900 500" stroke="#0b1f3a" stroke-width="22" fill="none"/></svg>`;
  return sharp(Buffer.from(svg)).png({ compressionLevel: 9 }).toBuffer();
}

function worstPdfInput(png: Buffer): ConsentPdfInput {
  const template = worstTemplate();
  const material = { name: word(60), iso6872Class: null, cementation: ["adhesive"] as string[] };
  const document = assembleConsent({
    title: template.title, templateVersion: 1, sections: template.sections, materialCautions: [prose(L.line, 99), prose(L.line, 98)],
    facts: { materialClass: null, dateOfBirth: "1980-01-01", patient: word(L.personName), tooth: "36 (Universal 19) — lower left first molar", material: material.name, mode: "refined", date: "Tuesday 8 December 2026, 09:30", fee: "$1,450.00", clinic: word(L.clinicName), dentist: word(L.personName), length: "about 2½ to 3 hours", ...crownWording(false) },
  });
  const answers = worstAnswers();
  const audit = ["Consent opened by the patient (first of 9 openings)", "Consent opened by the patient (latest of 9 openings)", "Consent signed by the patient", "Consent reviewed by the dentist"].map((event) => ({
    event, who: `${word(L.personName)} (patient)`, at: "Tuesday 1 December 2026, 10:02 · 2026-12-01T15:02:11.000Z", ip: word(L.ip), userAgent: word(L.userAgent),
  }));
  return {
    consentId: "6d0c1a2b-0000-4000-8000-000000000000", pdfVersion: 2, clinic: { name: word(L.clinicName), address: prose(L.address) },
    patientName: word(L.personName), document, acknowledgedAll: true, answers: answerLines(answers), flags: questionnaireFlags(answers, material),
    typedName: word(L.personName), signaturePng: png, signedAt: "Tuesday 1 December 2026, 10:02 · 2026-12-01T15:02:11.000Z", textSha256: "a".repeat(64),
    audit, review: { by: word(L.personName), at: "Tuesday 8 December 2026, 09:12 · 2026-12-08T14:12:00.000Z" }, previous: { version: 1, sha256: "b".repeat(64) },
    createdAt: new Date(),
  };
}

const sealInfo = { reason: "Consent reviewed by the dentist", clinicName: word(L.clinicName), location: prose(L.address), contact: "+1 613 555 0134", at: new Date() };

/** What issuePdf does for one version: lay out, save once for the content hash, seal. */
async function sealedPdf(input: ConsentPdfInput): Promise<{ bytes: Buffer; pages: number }> {
  const doc = await buildConsentPdf(input);
  await doc.save({ useObjectStreams: false });
  return { bytes: await sealPdf(doc, sealInfo), pages: doc.getPageCount() };
}

const cpuMs = (start: NodeJS.CpuUsage) => {
  const u = process.cpuUsage(start);
  return (u.user + u.system) / 1000;
};

export async function run(): Promise<Record<string, string | number>> {
  const sealFile = path.join(root, ".data", "bench", "clinic-seal.p12");
  mkdirSync(path.dirname(sealFile), { recursive: true });
  ensureSealCertificate({ file: sealFile, password: "bench-seal-passphrase" });
  Object.assign(process.env, { SEAL_CERT_PATH: sealFile, SEAL_CERT_PASSWORD: "bench-seal-passphrase" });

  // 1. The sealed PDF alone, worst input, after one warm-up (fonts read, code compiled).
  const png = await signaturePng();
  const input = worstPdfInput(png);
  const warm = await sealedPdf(input);
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    await sealedPdf(input);
    wall.push(performance.now() - t0);
    cpu.push(cpuMs(c0));
  }
  const w = stats(wall);
  const c = stats(cpu);

  // 2. A whole signing (decode the drawing, store the proof, lay out and seal, commit) with the
  // health route polled every 5 ms beside it.
  await ensureDatabase(new URL(process.env.DATABASE_URL!).pathname.slice(1));
  runCommand(path.join(root, "node_modules/.bin/tsx"), ["db/migrate.ts", "up"], { ...process.env });
  const t = await createTestClinic();
  const { user, patient } = await createTestPatient(t.clinic.id, word(L.personName));
  const template = worstTemplate();
  const published = await ConsentTemplate.create({ clinicId: t.clinic.id, version: 1, title: template.title, sections: template.sections, status: "published" });
  const { GET: health } = await import("@/app/api/health/route");
  const healthOnce = async () => {
    const t0 = performance.now();
    const res = await health();
    if (!res.ok) throw new Error(`health answered ${res.status}`);
    return performance.now() - t0;
  };
  const idle: number[] = [];
  for (let i = 0; i < 20; i++) idle.push(await healthOnce());

  const signingMs: number[] = [];
  const during: number[] = [];
  for (let i = 0; i < 3; i++) {
    const proposal = await createTestProposal(t, patient.id, { tooth: 36 });
    const startsAt = new Date(Date.now() + (5 + i) * 24 * 3600 * 1000);
    const visit = await Appointment.create({
      clinicId: t.clinic.id, proposalId: proposal.id, patientId: patient.id, dentistId: t.staff.dentist.id,
      materialId: t.materialByKey["lithium-disilicate"].id, mode: "refined", tooth: 36, status: "confirmed", startsAt,
      endsAt: new Date(startsAt.getTime() + 150 * 60_000), chairId: t.equipment.find((e) => e.kind === "chair")!.id,
      millId: t.equipment.find((e) => e.kind === "mill")!.id, furnaceId: null, feeCents: 145000, createdBy: null,
    });
    let done = false;
    const poller = (async () => {
      while (!done) {
        during.push(await healthOnce());
        await new Promise((r) => setTimeout(r, 5));
      }
    })();
    const t0 = performance.now();
    await sequelize.transaction(async (transaction) => {
      const signature = await decodeSignature(`data:image/png;base64,${png.toString("base64")}`);
      const ctx = await loadVisitContext(visit, transaction);
      const consent: Consent = await ensureLiveConsent(visit, transaction);
      await recordSignature(consent, ctx, {
        template: published, answers: worstAnswers(), acknowledged: [...SECTION_KEYS], typedName: word(L.personName), signaturePng: signature,
        at: new Date(), ip: word(L.ip), userAgent: word(L.userAgent), actorUserId: user.id,
      }, transaction);
      await issuePdf(consent, ctx, "signed", transaction);
    });
    signingMs.push(performance.now() - t0);
    done = true;
    await poller;
  }
  const h = stats(during);
  const idleStats = stats(idle);
  return {
    "worst-case PDF: pages": warm.pages,
    "worst-case PDF: size": `${Math.round(warm.bytes.length / 1024)} KB`,
    [`worst-case sealed PDF, median of ${RUNS} (target ≤ ${TARGET_MS} ms)`]: `${ms(w.median)} ${w.median <= TARGET_MS ? "ok" : "OVER"}`,
    "worst-case sealed PDF, max": ms(w.max),
    "worst-case sealed PDF, CPU median": ms(c.median),
    "whole signing with worst input, median of 3": ms(stats(signingMs).median),
    "/api/health idle, median": ms(idleStats.median),
    [`/api/health during signing: ${during.length} calls, median / p95`]: `${ms(h.median)} / ${ms(h.p95)}`,
    [`/api/health during signing, max (target ≤ ${TARGET_MS} ms)`]: `${ms(h.max)} ${h.max <= TARGET_MS ? "ok" : "OVER"}`,
  };
}
