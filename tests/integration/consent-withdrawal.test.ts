// Staff record a withdrawal the patient made by phone, in person or in writing: who, how, when; audited.
import { beforeAll, describe, expect, it } from "vitest";
import { Appointment, AuditEvent, Consent, ConsentTemplate } from "@/db/models";
import { recordWithdrawalForPatient } from "@/lib/data/consent-withdrawal";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, type TestClinic } from "../support/fixtures";
import { createVisit } from "../support/mail";
import { sessionOf } from "../support/session";

const HOUR = 3_600_000;
let t: TestClinic;
const asUser = sessionOf;

async function rejection(p: Promise<unknown>) {
  return p.then(() => null, (e) => e);
}

let templateId: string;
async function signedConsent(signedAt: Date, status: Appointment["status"] = "confirmed") {
  // The database lets treatment start only on a reviewed consent, so a visit under way gets one.
  const treating = status === "in_progress" || status === "completed";
  const { visit } = await createVisit(t, { startsAt: new Date(Date.now() + 72 * HOUR), status: treating ? "checked_in" : status });
  const consent = await Consent.create({
    clinicId: t.clinic.id, appointmentId: visit.id, patientId: visit.patientId, status: treating ? "reviewed" : "signed", templateId, templateVersion: 1,
    answers: {} as never, acknowledged: [], electronicRecordsVersion: "test", consentText: "Consent text", textSha256: "a".repeat(64),
    typedName: "Test Patient", signaturePng: Buffer.from([137, 80, 78, 71]), signedAt,
    ...(treating ? { reviewedAt: new Date(signedAt.getTime() + HOUR), reviewedBy: t.staff.dentist.id } : {}),
  });
  if (treating) await visit.update({ status });
  return consent;
}

beforeAll(async () => {
  t = await createTestClinic();
  templateId = (await ConsentTemplate.create({ clinicId: t.clinic.id, version: 1, title: "Test consent", sections: [], createdBy: t.staff.admin.id })).id;
});

describe("withdrawal recorded by staff", () => {
  it("records who, how and when (clinic time), and audits it", async () => {
    const now = new Date();
    const consent = await signedConsent(new Date(now.getTime() - 48 * HOUR));
    // Yesterday at 16:30 in Toronto, as the receptionist noted it on the phone.
    const day = new Intl.DateTimeFormat("en-CA", { timeZone: "America/Toronto", year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date(now.getTime() - 24 * HOUR));
    await recordWithdrawalForPatient({ user: asUser(t.staff.reception), input: { consentId: consent.id, byName: "The patient", via: "phone", date: day, time: "16:30", reason: "Wants to think it over" }, now });
    const row = (await Consent.findByPk(consent.id))!;
    expect(row.status).toBe("withdrawn");
    expect([row.withdrawnVia, row.withdrawnByName, row.withdrawnBy, row.withdrawnReason]).toEqual(["phone", "The patient", t.staff.reception.id, "Wants to think it over"]);
    // [P] Intl time-zone data: 16:30 on that day in Toronto, read back in the zone.
    expect(new Intl.DateTimeFormat("en-CA", { timeZone: "America/Toronto", hour: "2-digit", minute: "2-digit", hourCycle: "h23" }).format(row.withdrawnAt!)).toBe("16:30");
    const audit = await AuditEvent.findOne({ where: { subjectId: consent.id, action: "consent.withdrawn" } });
    expect(audit!.data).toMatchObject({ recordedForPatient: true, via: "phone", byName: "The patient" });
  });

  it("refuses a time in the future or before the signature, an unknown channel, a patient and another clinic's staff; nothing changes", async () => {
    const now = new Date();
    const consent = await signedConsent(new Date(now.getTime() - 2 * HOUR));
    const staff = asUser(t.staff.dentist);
    const day = (d: Date) => new Intl.DateTimeFormat("en-CA", { timeZone: "America/Toronto", year: "numeric", month: "2-digit", day: "2-digit" }).format(d);
    const base = { consentId: consent.id, byName: "The patient", via: "in_person" };
    const future = await rejection(recordWithdrawalForPatient({ user: staff, input: { ...base, date: day(new Date(now.getTime() + 48 * HOUR)), time: "09:00" }, now }));
    expect((future as AppError).status).toBe(422);
    const early = await rejection(recordWithdrawalForPatient({ user: staff, input: { ...base, date: day(new Date(now.getTime() - 72 * HOUR)), time: "09:00" }, now }));
    expect((early as AppError).message).toMatch(/before the consent was signed/);
    const badChannel = await rejection(recordWithdrawalForPatient({ user: staff, input: { ...base, via: "carrier pigeon", date: day(now), time: "00:00" }, now }));
    expect((badChannel as { issues?: unknown[] }).issues).toBeDefined();
    const patient = await rejection(recordWithdrawalForPatient({ user: { id: "x", email: "p@x", name: null, role: "patient", clinicId: null }, input: base, now }));
    expect((patient as AppError).status).toBe(403);
    const other = await createTestClinic();
    const foreign = await rejection(recordWithdrawalForPatient({ user: asUser(other.staff.reception), input: { ...base, date: day(now), time: "00:00" }, now }));
    expect((foreign as AppError).status).toBe(404);
    expect((await Consent.findByPk(consent.id))!.status).toBe("signed");
  });

  it("refuses once treatment has started", async () => {
    const consent = await signedConsent(new Date(Date.now() - 2 * HOUR), "in_progress");
    const now = new Date();
    const day = new Intl.DateTimeFormat("en-CA", { timeZone: "America/Toronto", year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date(now.getTime() - HOUR));
    const hhmm = new Intl.DateTimeFormat("en-CA", { timeZone: "America/Toronto", hour: "2-digit", minute: "2-digit", hourCycle: "h23" }).format(new Date(now.getTime() - HOUR));
    const err = await rejection(recordWithdrawalForPatient({ user: asUser(t.staff.reception), input: { consentId: consent.id, byName: "The patient", via: "in_writing", date: day, time: hhmm }, now }));
    expect((err as AppError).status).toBe(409);
  });
});
