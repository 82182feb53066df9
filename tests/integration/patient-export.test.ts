// "Download my records": the ZIP is read back with a different ZIP reader (yauzl) than the one
// that wrote it (jszip), against a real signed and reviewed consent and a real stored document.
import { createHash } from "node:crypto";
import sharp from "sharp";
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it, vi } from "vitest";
import yauzl from "yauzl";
import { Appointment, AuditEvent, ConsentPdf } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { createDocument } from "@/lib/data/documents";
import { openConsentForPatient, reviewConsent, signConsent } from "@/lib/data/consents";
import { QUESTION_KEYS, type QuestionnaireAnswers } from "@/lib/domain/consent-questionnaire";
import { SECTION_KEYS } from "@/lib/domain/consent-text";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";
import { pdfDocument } from "../support/sample-files";
import { sessionOf, signInAs, signOut } from "../support/session";

vi.mock("@/lib/auth/session", async () => (await import("../support/session")).fakeSessionModule());
const { GET: exportRoute } = await import("@/app/api/me/export/route");


let t: TestClinic;
let patientUser: SessionUser;
let patientId: string;
let consentId: string;
let documentBytes: Buffer;

beforeAll(async () => {
  t = await createTestClinic();
  const { user, patient } = await createTestPatient(t.clinic.id, "Élodie Vasquez-Brandt");
  patientUser = sessionOf(user);
  patientId = patient.id;
  const proposal = await createTestProposal(t, patient.id, { tooth: 46 });
  const startsAt = new Date(Date.now() + 6 * 24 * 3600 * 1000);
  const visit = await Appointment.create({
    clinicId: t.clinic.id, proposalId: proposal.id, patientId: patient.id, dentistId: t.staff.dentist.id,
    materialId: t.materialByKey["zirconia"].id, mode: "standard", tooth: 46, status: "confirmed", startsAt,
    endsAt: new Date(startsAt.getTime() + 150 * 60_000), chairId: t.equipment.find((e) => e.kind === "chair")!.id,
    millId: t.equipment.find((e) => e.kind === "mill")!.id, furnaceId: null, feeCents: 120000, createdBy: null,
  });
  const view = (await openConsentForPatient({ user: patientUser, appointmentId: visit.id, ip: "198.51.100.7", userAgent: "ExportTest" }))!;
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="640" height="220"><path d="M30 160 C 90 20, 140 30, 180 150 S 290 60, 330 130 S 460 40, 600 110" stroke="#0b1f3a" stroke-width="6" fill="none"/></svg>`;
  const png = await sharp(Buffer.from(svg)).png().toBuffer();
  const answers = { ...(Object.fromEntries(QUESTION_KEYS.map((k) => [k, "no"])) as Record<string, string>), otherAllergies: "", medicines: "", notes: "" } as QuestionnaireAnswers;
  const signed = await signConsent({
    user: patientUser, ip: "198.51.100.7", userAgent: "ExportTest",
    input: {
      appointmentId: visit.id, templateId: view.form!.templateId, textSha256: view.form!.textSha256, answers,
      acknowledged: [...SECTION_KEYS], electronicRecords: true, typedName: "Elodie Vasquez-Brandt", signature: `data:image/png;base64,${png.toString("base64")}`,
    },
  });
  consentId = signed.consentId;
  await reviewConsent({ user: sessionOf(t.staff.dentist), consentId, ip: "10.0.0.9", userAgent: "ExportTest" });
  documentBytes = pdfDocument("Referral letter for the export test");
  await createDocument({
    actor: patientUser, kind: "referral_letter", title: "Referral letter", file: { name: "referral.pdf", bytes: documentBytes },
    client: { ip: "198.51.100.7", userAgent: "ExportTest" },
  });
});

/** Every entry of a ZIP as read by yauzl (a ZIP reader independent of jszip). */
function unzip(bytes: Buffer): Promise<Map<string, Buffer>> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(bytes, { lazyEntries: true }, (err, zip) => {
      if (err || !zip) return reject(err);
      const out = new Map<string, Buffer>();
      zip.on("entry", (entry: yauzl.Entry) => {
        zip.openReadStream(entry, (e, stream) => {
          if (e || !stream) return reject(e);
          const chunks: Buffer[] = [];
          stream.on("data", (c: Buffer) => chunks.push(c));
          stream.on("end", () => {
            out.set(entry.fileName, Buffer.concat(chunks));
            zip.readEntry();
          });
        });
      });
      zip.on("end", () => resolve(out));
      zip.on("error", reject);
      zip.readEntry();
    });
  });
}

const sha256 = (b: Buffer) => createHash("sha256").update(b).digest("hex");

describe("GET /api/me/export", () => {
  it("gives the patient a ZIP whose JSON parses and whose consent PDFs match their stored SHA-256", async () => {
    signInAs(patientUser);
    const res = await exportRoute(new NextRequest("http://localhost/api/me/export"), undefined);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/zip");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="cuspal-records-\d{4}-\d{2}-\d{2}\.zip"$/);
    const entries = await unzip(Buffer.from(await res.arrayBuffer()));
    const names = [...entries.keys()].sort();
    expect(names).toContain("records.json");
    expect(names).toContain("README.txt");

    const data = JSON.parse(entries.get("records.json")!.toString("utf8"));
    expect(data.profile.id).toBe(patientId);
    expect(data.profile.name).toBe("Élodie Vasquez-Brandt");
    expect(data.proposals).toHaveLength(1);
    expect(data.proposals[0].tooth).toBe(46);
    expect(data.visits).toHaveLength(1);
    expect(data.consents).toHaveLength(1);

    const stored = await ConsentPdf.findAll({ where: { consentId }, order: [["version", "ASC"]] });
    expect(stored.map((p) => p.version)).toEqual([1, 2]);
    expect(data.consents[0].pdfs).toHaveLength(2);
    for (const [i, pdf] of data.consents[0].pdfs.entries()) {
      const bytes = entries.get(pdf.file)!;
      expect(bytes.subarray(0, 5).toString("latin1")).toBe("%PDF-"); // [P] ISO 32000-1 §7.5.2: a PDF file starts with its header "%PDF-"
      // The file in the ZIP is byte for byte the sealed PDF: its SHA-256 (FIPS 180-4, Node's OpenSSL) equals the stored one.
      expect(sha256(bytes)).toBe(stored[i].sha256);
      expect(pdf.sha256).toBe(stored[i].sha256);
    }

    expect(data.documents).toHaveLength(1);
    const doc = data.documents[0];
    expect(entries.get(doc.file)!.equals(documentBytes)).toBe(true);
    expect(sha256(entries.get(doc.file)!)).toBe(doc.sha256);

    expect(await AuditEvent.count({ where: { subjectId: patientId, action: "patient.records_exported" } })).toBe(1);
  });

  it("is for the signed-in patient only", async () => {
    signInAs(t.staff.reception);
    expect((await exportRoute(new NextRequest("http://localhost/api/me/export"), undefined)).status).toBe(403);
    signOut();
    expect((await exportRoute(new NextRequest("http://localhost/api/me/export"), undefined)).status).toBe(401);
  });
});
