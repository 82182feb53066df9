// A patient who reads French signs the French text: the record keeps the language and the SHA-256
// of exactly that text, the sealed PDF (read back with pdfjs-dist, an outside PDF parser) is in
// French with its accents intact, and the copy e-mailed to the patient is in French.
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { Appointment, Consent, ConsentPdf, MailOutbox, Patient } from "@/db/models";
import { openConsentForPatient, signConsent, staffConsentView } from "@/lib/data/consents";
import { sha256Hex } from "@/lib/domain/consent-hash";
import { QUESTION_KEYS, type QuestionnaireAnswers } from "@/lib/domain/consent-questionnaire";
import { SECTION_KEYS } from "@/lib/domain/consent-text";
import { composeMail, loadMessage } from "@/lib/mail/compose";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";
import { pdfPages } from "../support/pdf-text";
import { sessionOf } from "../support/session";

const UA = "ConsentTestFr/1.0";

async function pdfText(bytes: Buffer): Promise<string> {
  return (await pdfPages(bytes)).join("").replace(/\s+/g, " ");
}

let t: TestClinic;
let consentId: string;
let visitId: string;
let pdf: Buffer;
let formSha: string;

beforeAll(async () => {
  t = await createTestClinic({ timeZone: "America/Toronto" });
  const { user, patient } = await createTestPatient(t.clinic.id, "Renée Gagnon-Bélanger");
  await Patient.update({ language: "fr" }, { where: { id: patient.id } });
  const proposal = await createTestProposal(t, patient.id, { tooth: 36 });
  const startsAt = new Date(Date.now() + 5 * 24 * 3600 * 1000);
  const visit = await Appointment.create({
    clinicId: t.clinic.id, proposalId: proposal.id, patientId: patient.id, dentistId: t.staff.dentist.id,
    materialId: t.materialByKey["zirconia"].id, mode: "standard", tooth: 36, status: "confirmed", startsAt,
    endsAt: new Date(startsAt.getTime() + 150 * 60_000), chairId: t.equipment.find((e) => e.kind === "chair")!.id,
    millId: t.equipment.find((e) => e.kind === "mill")!.id, furnaceId: null, feeCents: 145000, createdBy: null,
  });
  visitId = visit.id;
  const me = sessionOf(user);
  const view = (await openConsentForPatient({ user: me, appointmentId: visit.id, ip: "198.51.100.40", userAgent: UA }))!;
  expect(view.form!.document.language).toBe("fr");
  formSha = view.form!.textSha256;
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="640" height="220"><path d="M30 160 C 90 20, 140 30, 180 150 S 290 60, 330 130 S 460 40, 600 110" stroke="#0b1f3a" stroke-width="6" fill="none"/></svg>`;
  const png = await sharp(Buffer.from(svg)).png().toBuffer();
  const answers = {
    ...(Object.fromEntries(QUESTION_KEYS.map((k) => [k, "no"])) as Record<(typeof QUESTION_KEYS)[number], "no">),
    grinding: "yes", otherAllergies: "", medicines: "Lévothyroxine", notes: "",
  } as QuestionnaireAnswers;
  const signed = await signConsent({
    user: me, ip: "198.51.100.40", userAgent: UA,
    input: {
      appointmentId: visit.id, templateId: view.form!.templateId, textSha256: formSha, answers,
      acknowledged: [...SECTION_KEYS], electronicRecords: true, typedName: "Renée Gagnon-Bélanger", signature: `data:image/png;base64,${png.toString("base64")}`,
    },
  });
  consentId = signed.consentId;
  pdf = (await ConsentPdf.findOne({ where: { consentId, version: 1 } }))!.pdf;
});

describe("consent signed in French", () => {
  it("records the language and the SHA-256 of exactly the French text", async () => {
    const c = (await Consent.findByPk(consentId))!;
    expect(c.language).toBe("fr");
    expect(c.consentText).toContain("## Votre rendez-vous");
    expect(c.consentText).toContain("première molaire inférieure gauche");
    expect(c.consentText).toMatch(/Loi de 2000 sur le commerce électronique/);
    // Node's crypto over the stored text (UTF-8, NFC) gives the stored fingerprint, the one the patient's screen carried.
    expect(c.textSha256).toBe(sha256Hex(c.consentText!));
    expect(c.textSha256).toBe(formSha);
  });

  it("seals a French PDF whose text pdfjs-dist reads back with é, è, à and ç intact", async () => {
    const text = await pdfText(pdf);
    expect(text).toContain("Votre rendez-vous");
    expect(text).toContain("Consentement à une couronne en une seule visite");
    expect(text).toContain("Questionnaire de santé");
    expect(text).toContain("Renée Gagnon-Bélanger");
    expect(text).toMatch(/é/);
    expect(text).toMatch(/è/);
    expect(text).toMatch(/à/);
    expect(text).toMatch(/ç/);
    expect(text).toContain("Langue du texte signé");
    expect(text).toContain("Français (fr)");
    const c = (await Consent.findByPk(consentId))!;
    expect(text).toContain(c.textSha256!);
  });

  it("shows the dentist which language was signed", async () => {
    const view = await staffConsentView({ user: sessionOf(t.staff.dentist), appointmentId: visitId });
    expect(view!.consent!.language).toBe("fr");
  });

  it("e-mails the patient's copy in French", async () => {
    const row = await MailOutbox.findOne({ where: { appointmentId: visitId, kind: "consent_copy" } });
    expect(row).not.toBeNull();
    const loaded = (await loadMessage(row!.id))!;
    const composed = await composeMail(loaded.row, loaded.visit);
    if (!("mail" in composed)) throw new Error(composed.skip);
    expect(composed.mail.subject).toBe("Votre copie de votre consentement signé");
    expect(composed.mail.text).toMatch(/Bonjour Renée Gagnon-Bélanger/);
    expect(composed.mail.html).toMatch(/<html[^>]*lang="fr"/);
  });
});
