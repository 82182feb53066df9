// Live re-planning against the real PostgreSQL: when a stage runs late, the visit's remaining
// reservations move in the same transaction, so availability for new bookings sees the real day.
import { beforeAll, describe, expect, it } from "vitest";
import { Appointment, AppointmentStage, AuditEvent, Consent, ConsentTemplate, Reservation } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { bookVisit } from "@/lib/booking/book";
import { searchSlots } from "@/lib/booking/search";
import { confirmVisit } from "@/lib/booking/transitions";
import { markStage } from "@/lib/data/progress";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, createTestPatient, createTestProposal, createUser, type TestClinic } from "../support/fixtures";
import { sessionOf } from "../support/session";

const now = new Date("2027-03-01T12:00:00Z");
const MIN = 60_000;
const HYBRID = "resin-ceramic-hybrid";

let t: TestClinic;
let reception: SessionUser;
let dentist: SessionUser;
let otherDentistId: string;
const asUser = sessionOf;

beforeAll(async () => {
  // One mill, so the mill is what a late milling takes from others; two chairs and furnaces.
  t = await createTestClinic({ chairs: 2, mills: 1, furnaces: 2 });
  reception = asUser(t.staff.reception);
  dentist = asUser(t.staff.dentist);
  otherDentistId = (await createUser(t.clinic.id, "dentist", "Second dentist")).id;
});

/** A proposal for a resin-ceramic hybrid molar crown; `second` gives it the clinic's other dentist. */
async function proposal(second = false) {
  const { patient } = await createTestPatient(t.clinic.id);
  const p = await createTestProposal(t, patient.id, { allow: { [HYBRID]: ["standard"] } });
  if (second) await p.update({ dentistId: otherDentistId });
  return p;
}

async function book(start: Date, second = false) {
  const p = await proposal(second);
  const visit = await bookVisit({ proposalId: p.id, materialId: t.materialByKey[HYBRID].id, mode: "standard", start, actor: { user: reception }, now });
  await confirmVisit({ user: reception }, visit.id);
  return (await Appointment.findByPk(visit.id))!;
}

let templateId: string | undefined;
async function reviewConsent(visit: Appointment) {
  templateId ??= (await ConsentTemplate.create({ clinicId: t.clinic.id, version: 1, title: "Test consent", sections: [], createdBy: t.staff.admin.id })).id;
  await Consent.create({
    clinicId: t.clinic.id, appointmentId: visit.id, patientId: visit.patientId, status: "reviewed", templateId, templateVersion: 1,
    answers: {} as never, acknowledged: [], electronicRecordsVersion: "test", consentText: "Consent text", textSha256: "a".repeat(64),
    typedName: "Test Patient", signaturePng: Buffer.from([137, 80, 78, 71]), signedAt: now, reviewedAt: now, reviewedBy: t.staff.dentist.id,
  });
}

const stagesOf = (visit: Appointment) => AppointmentStage.findAll({ where: { appointmentId: visit.id }, order: [["seq", "ASC"]] });

/** Runs the visit on plan up to fabrication, starts it on time and finishes it `lateMinutes` late. */
async function millLate(visit: Appointment, lateMinutes: number) {
  await reviewConsent(visit);
  for (const s of await stagesOf(visit)) {
    if (s.key === "fabrication") {
      await markStage({ user: dentist, appointmentId: visit.id, key: s.key, mark: { action: "start", at: s.plannedStart.toISOString() } });
      return markStage({ user: dentist, appointmentId: visit.id, key: s.key, mark: { action: "finish", at: new Date(s.plannedEnd.getTime() + lateMinutes * MIN).toISOString() } });
    }
    await markStage({ user: dentist, appointmentId: visit.id, key: s.key, mark: { action: "start", at: s.plannedStart.toISOString() } });
    await markStage({ user: dentist, appointmentId: visit.id, key: s.key, mark: { action: "finish", at: s.plannedEnd.toISOString() } });
  }
  throw new Error("no fabrication stage");
}

async function holds(visit: Appointment) {
  const rows = await Reservation.findAll({ where: { appointmentId: visit.id, active: true } });
  const range = (r: Reservation) => (r.during as [{ value: Date }, { value: Date }]).map((x) => new Date(x.value).toISOString());
  return Object.fromEntries(rows.map((r) => [`${r.stage}/${r.resourceKind}`, range(r)]));
}

describe("live re-planning", () => {
  it("a milling that runs 20 minutes late moves the visit's holds, and a booking at the time that was free on that mill is refused", async () => {
    // Wednesday 08:00 in Toronto. Hybrid molar, standard: fabrication from +70 to +82 min, so the mill is held 09:10–09:22.
    const a = await book(new Date("2027-03-10T13:00:00Z"));
    const before = await holds(a);
    expect(before["fabrication/mill"]).toEqual(["2027-03-10T14:10:00.000Z", "2027-03-10T14:22:00.000Z"]);

    // A second visit at 08:15 with the other dentist at the other chair would mill 09:25–09:37: free before.
    const wanted = new Date("2027-03-10T13:15:00Z");
    const p = await proposal(true);
    const search = () => searchSlots({ proposal: p, materialId: t.materialByKey[HYBRID].id, mode: "standard", from: "2027-03-10", days: 1, now });
    expect((await search()).slots.map((s) => s.start.toISOString())).toContain(wanted.toISOString());

    const result = await millLate(a, 20);
    expect(result.replan.conflicts).toEqual([]);
    const after = await holds(a);
    // The mill is held until the milling really ended; every later stage moved 20 minutes, the chair's buffer with it.
    expect(after["fabrication/mill"]).toEqual(["2027-03-10T14:10:00.000Z", "2027-03-10T14:42:00.000Z"]);
    for (const key of ["try_in/chair", "try_in/dentist", "finishing/chair", "cementation/chair", "cementation/dentist"]) {
      const [s0, e0] = before[key].map((x: string) => new Date(x).getTime());
      const [s1, e1] = after[key].map((x: string) => new Date(x).getTime());
      expect([key, s1 - s0, e1 - e0]).toEqual([key, 20 * MIN, 20 * MIN]);
    }
    // Stages already done keep their times.
    expect(after["design/dentist"]).toEqual(before["design/dentist"]);

    // Availability now sees the real day: 08:15 is no longer offered, and booking it is refused with alternatives.
    expect((await search()).slots.map((s) => s.start.toISOString())).not.toContain(wanted.toISOString());
    const err = await bookVisit({ proposalId: p.id, materialId: t.materialByKey[HYBRID].id, mode: "standard", start: wanted, actor: { user: reception }, now }).then(() => null, (e) => e);
    expect(err).toBeInstanceOf(AppError);
    expect((err as AppError).status).toBe(409);
    const alternatives = (err as AppError).options.extra!.alternatives as { start: string }[];
    expect(alternatives.length).toBeGreaterThan(0);
    expect(alternatives.map((x) => new Date(x.start).toISOString())).not.toContain(wanted.toISOString());
  });

  it("a hold that another visit already has stays where it was and is reported as a conflict", async () => {
    // Thursday: the first visit mills 09:10–09:22; a second visit booked at 08:15 mills 09:25–09:37.
    const a = await book(new Date("2027-03-11T13:00:00Z"));
    const b = await book(new Date("2027-03-11T13:15:00Z"), true);
    const before = await holds(a);
    const result = await millLate(a, 20);
    // The mill extension to 09:42 would overlap the second visit's milling: it stays, and is reported.
    expect(result.replan.conflicts).toContainEqual(expect.objectContaining({ stage: "fabrication", resourceKind: "mill", blockedByAppointmentId: b.id }));
    const after = await holds(a);
    expect(after["fabrication/mill"]).toEqual(before["fabrication/mill"]);
    // The stages that could move still did.
    expect(new Date(after["try_in/chair"][0]).getTime() - new Date(before["try_in/chair"][0]).getTime()).toBe(20 * MIN);
    const audit = await AuditEvent.findOne({ where: { subjectId: a.id, action: "visit.replan_conflict" } });
    expect(audit).not.toBeNull();
    // Nothing overlaps on the mill: the exclusion constraint still holds.
    const [rows] = await Reservation.sequelize!.query(
      `SELECT count(*)::int AS n FROM reservations x JOIN reservations y ON x.id < y.id AND x.resource_id = y.resource_id AND x.during && y.during WHERE x.active AND y.active AND x.clinic_id = :c`,
      { replacements: { c: t.clinic.id } },
    );
    expect((rows as { n: number }[])[0].n).toBe(0);
  });
});
