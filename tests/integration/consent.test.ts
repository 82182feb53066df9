// Informed consent end to end through the route handlers, against the real PostgreSQL: signing
// with its proof, refusals that store nothing, access rules, review with a second sealed version,
// verification, withdrawal, the database triggers and the treatment guard. The session is faked.
import sharp from "sharp";
import { NextRequest } from "next/server";
import { QueryTypes } from "sequelize";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { Appointment, AuditEvent, Consent, ConsentPdf, ConsentTemplate, sequelize } from "@/db/models";
import { openConsentForPatient, publishTemplateVersion } from "@/lib/data/consents";
import { sha256Hex } from "@/lib/domain/consent-hash";
import { QUESTION_KEYS, type QuestionnaireAnswers } from "@/lib/domain/consent-questionnaire";
import { consentText, DEFAULT_SECTIONS, SECTION_KEYS } from "@/lib/domain/consent-text";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";
import { signedInUser, signInAs, signOut, type Person } from "../support/session";
import { hugePng } from "../support/sample-files";
import { DEFAULT_SECTIONS_FR, DEFAULT_TEMPLATE_TITLE_FR } from "@/lib/domain/consent-text-fr";

vi.mock("@/lib/auth/session", async () => (await import("../support/session")).fakeSessionModule());

const consentsRoute = await import("@/app/api/consents/route");
const { GET: pdfRoute } = await import("@/app/api/consents/[id]/pdf/route");
const { POST: reviewRoute } = await import("@/app/api/consents/[id]/review/route");
const { POST: withdrawRoute } = await import("@/app/api/consents/[id]/withdraw/route");
const { POST: verifyRoute } = await import("@/app/api/consents/verify/route");

const as = signInAs;
const CLIENT = { "x-forwarded-for": "203.0.113.7", "user-agent": "ConsentTest/1.0 (integration)" };
const DAY = 24 * 3600 * 1000;

let t: TestClinic;
let other: TestClinic;

beforeAll(async () => {
  t = await createTestClinic();
  other = await createTestClinic();
});

afterEach(() => {
  signOut();
});

async function visitFor(clinic: TestClinic, name: string, opts: { startsAt?: Date; status?: Appointment["status"] } = {}) {
  const { user, patient } = await createTestPatient(clinic.clinic.id, name);
  const proposal = await createTestProposal(clinic, patient.id, { tooth: 36 });
  const chair = clinic.equipment.find((e) => e.kind === "chair")!;
  const mill = clinic.equipment.find((e) => e.kind === "mill")!;
  const startsAt = opts.startsAt ?? new Date(Date.now() + 3 * DAY);
  const visit = await Appointment.create({
    clinicId: clinic.clinic.id, proposalId: proposal.id, patientId: patient.id, dentistId: clinic.staff.dentist.id,
    materialId: clinic.materialByKey["zirconia"].id, mode: "standard", tooth: 36, status: opts.status ?? "confirmed", startsAt,
    endsAt: new Date(startsAt.getTime() + 150 * 60_000), chairId: chair.id, millId: mill.id, furnaceId: null, feeCents: 145000, createdBy: null,
  });
  return { user, patient, visit };
}

const answers = (over: Partial<QuestionnaireAnswers> = {}): QuestionnaireAnswers => ({
  ...(Object.fromEntries(QUESTION_KEYS.map((k) => [k, "no"])) as Record<(typeof QUESTION_KEYS)[number], "no">),
  otherAllergies: "",
  medicines: "",
  notes: "",
  ...over,
});

/** A signature-like wave drawn as SVG and rasterised to PNG. */
async function drawnSignature(): Promise<string> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="600" height="200"><path d="M30 150 C 90 20, 130 20, 170 140 S 270 60, 310 120 S 430 40, 570 100" stroke="#1f2a37" stroke-width="5" fill="none"/></svg>`;
  return `data:image/png;base64,${(await sharp(Buffer.from(svg)).png().toBuffer()).toString("base64")}`;
}

async function blankPng(draw = ""): Promise<string> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="600" height="200">${draw}</svg>`;
  return `data:image/png;base64,${(await sharp(Buffer.from(svg)).png().toBuffer()).toString("base64")}`;
}

async function open(person: Person, visitId: string) {
  as(person);
  const view = await openConsentForPatient({ user: signedInUser()!, appointmentId: visitId, ip: "203.0.113.7", userAgent: "ConsentTest/1.0 (integration)" });
  if (!view?.form) throw new Error("No consent form to sign.");
  return view;
}

async function signBody(person: Person, visitId: string, over: Record<string, unknown> = {}) {
  const view = await open(person, visitId);
  return {
    appointmentId: visitId,
    templateId: view.form!.templateId,
    textSha256: view.form!.textSha256,
    answers: answers({ allergyLatex: "yes", grinding: "unsure" }),
    acknowledged: [...SECTION_KEYS],
    electronicRecords: true,
    typedName: person.name,
    signature: await drawnSignature(),
    ...over,
  };
}

async function postSign(body: unknown, raw?: string) {
  const res = await consentsRoute.POST(
    new NextRequest("http://localhost/api/consents", { method: "POST", body: raw ?? JSON.stringify(body), headers: { "content-type": "application/json", ...CLIENT } }),
    undefined,
  );
  return { status: res.status, body: await res.json() };
}

const params = (id: string) => ({ params: Promise.resolve({ id }) });
const post = (path: string, body?: unknown) =>
  new NextRequest(`http://localhost${path}`, { method: "POST", headers: { ...CLIENT, ...(body ? { "content-type": "application/json" } : {}) }, ...(body ? { body: JSON.stringify(body) } : {}) });

async function getPdf(id: string, query = "") {
  return pdfRoute(new NextRequest(`http://localhost/api/consents/${id}/pdf${query}`), params(id));
}

async function verify(bytes: Uint8Array | null) {
  const form = new FormData();
  if (bytes) form.set("file", new File([Buffer.from(bytes)], "consent.pdf", { type: "application/pdf" }));
  const res = await verifyRoute(new NextRequest("http://localhost/api/consents/verify", { method: "POST", body: form }), undefined);
  return { status: res.status, body: await res.json() };
}

/** Everything a signature could have written for a visit. */
async function storedFor(visitId: string) {
  const consents = await Consent.findAll({ where: { appointmentId: visitId } });
  const ids = consents.map((c) => c.id);
  return {
    signed: consents.filter((c) => c.signedAt).length,
    pdfs: ids.length ? await ConsentPdf.count({ where: { consentId: ids } }) : 0,
    signedEvents: ids.length ? await AuditEvent.count({ where: { subjectId: ids, action: "consent.signed" } }) : 0,
    mails: Number((await sequelize.query<{ n: string }>("SELECT count(*) AS n FROM mail_outbox WHERE appointment_id = $1 AND kind = 'consent_copy'", { bind: [visitId], type: QueryTypes.SELECT }))[0].n),
  };
}

describe("signing", () => {
  it("opens a pending consent, records the opening, and signs it with its whole proof", async () => {
    const { user, visit } = await visitFor(t, "Zoë Łukasiewicz-Núñez");
    const body = await signBody(user, visit.id);
    const pending = await Consent.findOne({ where: { appointmentId: visit.id } });
    expect(pending!.status).toBe("pending");
    const viewed = await AuditEvent.findOne({ where: { subjectId: pending!.id, action: "consent.viewed" } });
    expect(viewed).toMatchObject({ actorUserId: user.id, ip: "203.0.113.7", userAgent: "ConsentTest/1.0 (integration)" });

    const res = await postSign(body);
    expect(res.status).toBe(201);
    expect(res.body).toEqual({ id: pending!.id, status: "signed", signedAt: expect.any(String) });

    const consent = (await Consent.findByPk(pending!.id))!;
    expect(consent).toMatchObject({
      status: "signed", typedName: "Zoë Łukasiewicz-Núñez", signedIp: "203.0.113.7", signedUserAgent: "ConsentTest/1.0 (integration)",
      templateVersion: 1, electronicRecordsVersion: expect.any(String), acknowledged: [...SECTION_KEYS],
    });
    // The stored fingerprint is the SHA-256 of the stored text, and matches what the page showed.
    expect(consent.textSha256).toBe(sha256Hex(consent.consentText!));
    expect(consent.textSha256).toBe(body.textSha256);
    expect(consent.consentText).toContain("36 (Universal 19) — lower left first molar");
    // The stored image is the PNG that was drawn, byte for byte.
    expect(Buffer.compare(consent.signaturePng!, Buffer.from((body.signature as string).split(",")[1], "base64"))).toBe(0);
    expect(consent.flags.map((f) => f.key)).toEqual(["allergyLatex", "grinding"]);

    const [pdf] = await ConsentPdf.findAll({ where: { consentId: consent.id } });
    expect(pdf).toMatchObject({ version: 1, reason: "signed" });
    expect(pdf.pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    expect(pdf.sha256).toBe(sha256Hex(pdf.pdf));

    // The patient's copy waits in the mail outbox with the sealed PDF attached.
    const [mail] = await sequelize.query<{ attachment: Buffer; data: { filename: string } }>(
      "SELECT attachment, data FROM mail_outbox WHERE appointment_id = $1 AND kind = 'consent_copy'",
      { bind: [visit.id], type: QueryTypes.SELECT },
    );
    expect(Buffer.compare(mail.attachment, pdf.pdf)).toBe(0);
    expect(mail.data.filename).toMatch(/^consent-tooth-36-\d{4}-\d{2}-\d{2}-v1\.pdf$/);

    as(t.staff.reception);
    const list = await consentsRoute.GET(new NextRequest("http://localhost/api/consents?status=signed"), undefined);
    expect(list.status).toBe(200);
    const { consents } = await list.json();
    expect(consents).toContainEqual(expect.objectContaining({ id: consent.id, appointmentId: visit.id, status: "signed", signedAt: consent.signedAt!.toISOString() }));
    expect(consents.every((c: { status: string }) => c.status === "signed")).toBe(true);
  });

  it("refuses bad input with a clear message and stores nothing", async () => {
    const { user, visit } = await visitFor(t, "Rafael Okonkwo-Lind");
    const stranger = await visitFor(t, "Someone Else");
    const good = await signBody(user, visit.id);
    const cases: { name: string; body?: unknown; raw?: string; status: number; field?: string; error: RegExp }[] = [
      { name: "a missing acknowledgement", body: { ...good, acknowledged: SECTION_KEYS.slice(1) }, status: 400, field: "acknowledged", error: /tick every section/ },
      { name: "no records agreement", body: { ...good, electronicRecords: false }, status: 400, field: "electronicRecords", error: /electronically/ },
      { name: "an empty signature", body: { ...good, signature: await blankPng() }, status: 422, field: "signature", error: /draw your signature/ },
      { name: "a dot for a signature", body: { ...good, signature: await blankPng('<circle cx="300" cy="100" r="3" fill="#000"/>') }, status: 422, field: "signature", error: /too small or too simple/ },
      { name: "a too-large payload", body: { ...good, signature: `data:image/png;base64,${"A".repeat(500_000)}` }, status: 413, field: "signature", error: /too large/ },
      { name: "not a PNG", body: { ...good, signature: `data:image/png;base64,${Buffer.from("GIF89a not a png").toString("base64")}` }, status: 422, field: "signature", error: /could not be read/ },
      {
        name: "a signature of few bytes but 16,000 × 16,000 pixels", body: { ...good, signature: `data:image/png;base64,${hugePng().toString("base64")}` },
        status: 422, field: "signature", error: /^That signature image is 16000 × 16000 pixels; a signature box is at most 3000 × 3000\./,
      },
      { name: "a note over its cap", body: { ...good, answers: { ...good.answers, notes: "x".repeat(1001) } }, status: 400, field: "answers.notes", error: /under 1000 characters/ },
      { name: "another patient's visit", body: { ...good, appointmentId: stranger.visit.id }, status: 404, error: /was not found/ },
      { name: "someone else's name", body: { ...good, typedName: "Rafael Someone" }, status: 422, field: "typedName", error: /Rafael Okonkwo-Lind/ },
      { name: "a text that is not the one shown", body: { ...good, textSha256: "0".repeat(64) }, status: 409, field: "textSha256", error: /reload the page/ },
      { name: "malformed JSON", raw: "{not json", status: 400, error: /valid JSON/ },
    ];
    as(user);
    for (const c of cases) {
      const res = await postSign(c.body, c.raw);
      expect.soft(res.status, c.name).toBe(c.status);
      expect.soft(res.body.error, c.name).toMatch(c.error);
      if (c.field) expect.soft(res.body.field, c.name).toBe(c.field);
    }
    expect(await storedFor(visit.id)).toEqual({ signed: 0, pdfs: 0, signedEvents: 0, mails: 0 });
    expect(await storedFor(stranger.visit.id)).toEqual({ signed: 0, pdfs: 0, signedEvents: 0, mails: 0 });

    // Staff cannot sign for the patient.
    as(t.staff.reception);
    expect((await postSign(good)).status).toBe(403);
    expect(await storedFor(visit.id)).toMatchObject({ signed: 0 });
  });

  it("refuses a signature for a withdrawn template version, then accepts the new version", async () => {
    const clinic = await createTestClinic();
    const { user, visit } = await visitFor(clinic, "Mireille Castellanos");
    const old = await signBody(user, visit.id);
    as(clinic.staff.admin);
    const published = await publishTemplateVersion({
      user: signedInUser()!, ip: "198.51.100.2", userAgent: "ConsentTest/1.0",
      values: { title: "Consent to a same-day crown", sections: DEFAULT_SECTIONS.map((s) => (s.key === "costs" ? { ...s, body: `${s.body}\n\nPayment is due on the day.` } : s)) },
    });
    // Both languages are published together: without the French text nothing is published.
    expect(published).toMatchObject({ ok: false, field: "fr" });
    const bilingual = await publishTemplateVersion({
      user: signedInUser()!, ip: "198.51.100.2", userAgent: "ConsentTest/1.0",
      values: {
        title: "Consent to a same-day crown", sections: DEFAULT_SECTIONS.map((s) => (s.key === "costs" ? { ...s, body: `${s.body}\n\nPayment is due on the day.` } : s)),
        fr: { title: DEFAULT_TEMPLATE_TITLE_FR, sections: DEFAULT_SECTIONS_FR },
      },
    });
    expect(bilingual).toEqual({ ok: true, version: 2 });
    expect((await ConsentTemplate.findByPk(old.templateId as string))!.status).toBe("withdrawn");

    as(user);
    const refused = await postSign(old);
    expect(refused).toEqual({ status: 409, body: { error: expect.stringMatching(/replaced by a newer version/), field: "templateId" } });
    expect(await storedFor(visit.id)).toMatchObject({ signed: 0, pdfs: 0 });

    const fresh = await signBody(user, visit.id);
    expect(fresh.templateId).not.toBe(old.templateId);
    const res = await postSign(fresh);
    expect(res.status).toBe(201);
    expect((await Consent.findByPk(res.body.id))!.templateVersion).toBe(2);
    expect((await Consent.findByPk(res.body.id))!.consentText).toContain("Payment is due on the day.");
  });

  it("refuses to sign twice", async () => {
    const { user, visit } = await visitFor(t, "Ada Twice");
    const body = await signBody(user, visit.id);
    expect((await postSign(body)).status).toBe(201);
    const again = await postSign(body);
    expect(again.status).toBe(409);
    expect(await storedFor(visit.id)).toMatchObject({ signed: 1, pdfs: 1, signedEvents: 1, mails: 1 });
  });
});

describe("access, review and verification", () => {
  let signed: { consentId: string; visitId: string; patient: Person };

  beforeAll(async () => {
    const { user, visit } = await visitFor(t, "Henrike Valdés");
    const res = await postSign(await signBody(user, visit.id));
    signed = { consentId: res.body.id, visitId: visit.id, patient: user };
  });

  it("gives the PDF to its patient and the clinic's staff, and 404 to anyone else", async () => {
    as(signed.patient);
    const own = await getPdf(signed.consentId);
    expect(own.status).toBe(200);
    expect(own.headers.get("content-type")).toBe("application/pdf");
    expect(Buffer.from(await own.arrayBuffer()).subarray(0, 5).toString("latin1")).toBe("%PDF-");
    for (const role of ["reception", "dentist", "admin"] as const) {
      as(t.staff[role]);
      expect((await getPdf(signed.consentId)).status, role).toBe(200);
    }
    const otherPatient = await createTestPatient(t.clinic.id, "Nosy Neighbour");
    as(otherPatient.user);
    const res = await getPdf(signed.consentId);
    expect(res.status).toBe(404);
    expect(await res.json()).toEqual({ error: "That consent was not found." });
    expect((await withdrawRoute(post(`/api/consents/${signed.consentId}/withdraw`), params(signed.consentId))).status).toBe(404);
    as(other.staff.dentist);
    expect((await getPdf(signed.consentId)).status).toBe(404);
    expect((await reviewRoute(post(`/api/consents/${signed.consentId}/review`), params(signed.consentId))).status).toBe(404);
    as(signed.patient);
    expect((await getPdf("not-a-uuid")).status).toBe(400);
    signOut();
    expect((await getPdf(signed.consentId)).status).toBe(401);
  });

  it("lets only a dentist review, issues a second sealed version and keeps the first", async () => {
    as(t.staff.reception);
    expect((await reviewRoute(post(`/api/consents/${signed.consentId}/review`), params(signed.consentId))).status).toBe(403);
    const v1 = Buffer.from(await (await getPdf(signed.consentId)).arrayBuffer());

    as(t.staff.dentist);
    const res = await reviewRoute(post(`/api/consents/${signed.consentId}/review`), params(signed.consentId));
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ id: signed.consentId, status: "reviewed", reviewedAt: expect.any(String), pdfVersion: 2 });
    const again = await reviewRoute(post(`/api/consents/${signed.consentId}/review`), params(signed.consentId));
    expect(again.status).toBe(409);

    const consent = (await Consent.findByPk(signed.consentId))!;
    expect(consent).toMatchObject({ status: "reviewed", reviewedBy: t.staff.dentist.id, reviewedIp: "203.0.113.7" });
    expect(await AuditEvent.count({ where: { subjectId: signed.consentId, action: "consent.reviewed" } })).toBe(1);

    const latest = Buffer.from(await (await getPdf(signed.consentId)).arrayBuffer());
    const first = Buffer.from(await (await getPdf(signed.consentId, "?version=1")).arrayBuffer());
    expect(Buffer.compare(first, v1)).toBe(0);
    expect(Buffer.compare(latest, v1)).not.toBe(0);
    expect(sha256Hex(latest)).toBe((await ConsentPdf.findOne({ where: { consentId: signed.consentId, version: 2 } }))!.sha256);
    expect((await getPdf(signed.consentId, "?version=9")).status).toBe(404);
    expect((await getPdf(signed.consentId, "?version=x")).status).toBe(400);

    // Both versions stay verifiable.
    expect(await verify(first)).toEqual({ status: 200, body: { match: true, consentId: signed.consentId } });
    expect(await verify(latest)).toEqual({ status: 200, body: { match: true, consentId: signed.consentId } });
  });

  it("says a PDF with one changed byte does not match, and another clinic's staff get no match", async () => {
    as(t.staff.reception);
    const pdf = (await ConsentPdf.findOne({ where: { consentId: signed.consentId, version: 1 } }))!.pdf;
    const changed = Buffer.from(pdf);
    changed[Math.floor(changed.length / 2)] ^= 0x01;
    expect(await verify(changed)).toEqual({ status: 200, body: { match: false } });
    expect(await verify(null)).toEqual({ status: 400, body: { error: "Choose a PDF file to check.", field: "file" } });
    as(other.staff.admin);
    expect(await verify(pdf)).toEqual({ status: 200, body: { match: false } });
    as(signed.patient);
    expect((await verify(pdf)).status).toBe(403);
  });

  it("answers a bad status filter with 400 and the field", async () => {
    as(t.staff.admin);
    const res = await consentsRoute.GET(new NextRequest("http://localhost/api/consents?status=lost"), undefined);
    expect(res.status).toBe(400);
    expect(await res.json()).toEqual({ error: expect.stringContaining("Status must be one of"), field: "status" });
  });
});

describe("withdrawal", () => {
  it("keeps the withdrawn record and lets the visit need consent again", async () => {
    const { user, visit } = await visitFor(t, "Leopold Ashgrove");
    const first = await postSign(await signBody(user, visit.id));
    as(user);
    const res = await withdrawRoute(post(`/api/consents/${first.body.id}/withdraw`, { reason: "I want to think about it." }), params(first.body.id));
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ id: first.body.id, status: "withdrawn", withdrawnAt: expect.any(String) });
    const kept = (await Consent.findByPk(first.body.id))!;
    expect(kept).toMatchObject({ status: "withdrawn", withdrawnBy: user.id, withdrawnReason: "I want to think about it.", typedName: "Leopold Ashgrove" });
    expect(await ConsentPdf.count({ where: { consentId: kept.id } })).toBe(1);
    expect((await withdrawRoute(post(`/api/consents/${first.body.id}/withdraw`), params(first.body.id))).status).toBe(409);

    // Opening the page again starts a new pending consent; signing it works.
    const second = await postSign(await signBody(user, visit.id));
    expect(second.status).toBe(201);
    expect(second.body.id).not.toBe(first.body.id);
    expect(await Consent.count({ where: { appointmentId: visit.id } })).toBe(2);
  });

  it("is refused once the visit has started", async () => {
    const { user, visit } = await visitFor(t, "Past Visit", { startsAt: new Date(Date.now() + 60_000) });
    const signed = await postSign(await signBody(user, visit.id));
    await sequelize.query("UPDATE appointments SET starts_at = now() - interval '1 minute' WHERE id = $1", { bind: [visit.id] });
    as(user);
    const res = await withdrawRoute(post(`/api/consents/${signed.body.id}/withdraw`), params(signed.body.id));
    expect(res.status).toBe(409);
    expect((await Consent.findByPk(signed.body.id))!.status).toBe("signed");
  });
});

describe("the database keeps signed consents as they are", () => {
  let consentId: string;
  beforeAll(async () => {
    const { user, visit } = await visitFor(t, "Trigger Tester");
    consentId = (await postSign(await signBody(user, visit.id))).body.id;
  });

  const refusal = (sql: string, bind: unknown[]) => sequelize.query(sql, { bind }).then(() => "stored", (e: Error) => e.message);

  it("refuses changing the signed fields, deleting the record, or going back to pending", async () => {
    expect(await refusal("UPDATE consents SET typed_name = 'Someone Else' WHERE id = $1", [consentId])).toMatch(/signed consent cannot be changed/);
    expect(await refusal("UPDATE consents SET consent_text = consent_text || ' ' WHERE id = $1", [consentId])).toMatch(/signed consent cannot be changed/);
    expect(await refusal("UPDATE consents SET signature_png = '\\x00'::bytea WHERE id = $1", [consentId])).toMatch(/signed consent cannot be changed/);
    expect(await refusal("UPDATE consents SET status = 'pending', signed_at = NULL WHERE id = $1", [consentId])).toMatch(/cannot be changed|cannot go from/);
    expect(await refusal("DELETE FROM consents WHERE id = $1", [consentId])).toMatch(/never deleted/);
    expect((await Consent.findByPk(consentId))!.typedName).toBe("Trigger Tester");
  });

  it("refuses changing or deleting a sealed PDF and a published template version", async () => {
    expect(await refusal("UPDATE consent_pdfs SET pdf = '\\x00'::bytea WHERE consent_id = $1", [consentId])).toMatch(/never changed or deleted/);
    expect(await refusal("DELETE FROM consent_pdfs WHERE consent_id = $1", [consentId])).toMatch(/never changed or deleted/);
    const template = (await Consent.findByPk(consentId))!.templateId;
    expect(await refusal("UPDATE consent_templates SET sections = '[]'::jsonb WHERE id = $1", [template])).toMatch(/publish a new version/);
    expect(await refusal("DELETE FROM consent_templates WHERE id = $1", [template])).toMatch(/never deleted/);
  });
});

describe("treatment guard", () => {
  it("refuses starting or completing treatment until the consent is signed and reviewed", async () => {
    const { user, visit } = await visitFor(t, "Guarded Patient", { status: "checked_in" });
    const start = (v: Appointment) => sequelize.transaction((transaction) => v.update({ status: "in_progress" }, { transaction }));
    const refused = await start(visit).then(() => null, (e) => e);
    expect(refused).toBeInstanceOf(AppError);
    expect(refused).toMatchObject({ status: 409, message: "Consent must be signed and reviewed before treatment starts." });
    // A bulk update without instance hooks is refused too.
    const bulk = await Appointment.update({ status: "completed" }, { where: { id: visit.id } }).then(() => null, (e) => e);
    expect(bulk).toMatchObject({ status: 409 });
    expect((await Appointment.findByPk(visit.id))!.status).toBe("checked_in");

    const signed = await postSign(await signBody(user, visit.id));
    const stillRefused = await start((await Appointment.findByPk(visit.id))!).then(() => null, (e) => e);
    expect(stillRefused).toMatchObject({ status: 409 });

    as(t.staff.dentist);
    expect((await reviewRoute(post(`/api/consents/${signed.body.id}/review`), params(signed.body.id))).status).toBe(200);
    await start((await Appointment.findByPk(visit.id))!);
    expect((await Appointment.findByPk(visit.id))!.status).toBe("in_progress");
    // Other changes to a visit are not the guard's business.
    await sequelize.transaction(async (transaction) => (await Appointment.findByPk(visit.id, { transaction }))!.update({ statusReason: "note" }, { transaction }));
  });
});

describe("consent text of a signed record", () => {
  it("is the canonical text of what the form showed", async () => {
    const { user, visit } = await visitFor(t, "Canon Check");
    const view = await open(user, visit.id);
    expect(sha256Hex(consentText(view.form!.document))).toBe(view.form!.textSha256);
  });
});
