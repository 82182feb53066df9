// The clinic's day against the real PostgreSQL: stage progress and visit status, knock-on delays on
// the board, crown block lots and recalls, out-of-service ranges, and duration statistics.
import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { Appointment, AppointmentStage, AuditEvent, BlockLot, Consent, ConsentTemplate, EquipmentOutage } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { bookVisit } from "@/lib/booking/book";
import { loadTimeline } from "@/lib/booking/context";
import { searchSlots } from "@/lib/booking/search";
import { cancelVisit, confirmVisit } from "@/lib/booking/transitions";
import { loadBoard } from "@/lib/data/board";
import { findPatientsByLot, listLotsForPatient, listLotsForVisit, recordLot } from "@/lib/data/lots";
import { createOutage, endOutage, listOutages } from "@/lib/data/outages";
import { loadVisitProgress, markStage, stageTimeStats } from "@/lib/data/progress";
import { GROUP_SEPARATOR } from "@/lib/domain/gs1";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, createTestPatient, createTestProposal, createUser, type TestClinic } from "../support/fixtures";
import { sessionOf as asUser } from "../support/session";

const now = new Date("2027-03-01T12:00:00Z");
const DAY = "2027-03-10"; // a Wednesday; Toronto is on EST (UTC−5) then
const wed0800 = new Date("2027-03-10T13:00:00Z");
const MIN = 60_000;

let t: TestClinic;
let reception: SessionUser;
let dentist: SessionUser;

async function rejection(p: Promise<unknown>): Promise<AppError> {
  const err = await p.then(() => null, (e) => e);
  expect(err).toBeInstanceOf(AppError);
  return err as AppError;
}

async function book(start: Date, materialKey = "zirconia", mode: "rapid" | "standard" = "standard", name = "Test Patient") {
  const { patient } = await createTestPatient(t.clinic.id, name);
  const proposal = await createTestProposal(t, patient.id, { allow: { zirconia: ["rapid", "standard"], "lithium-disilicate": ["standard"] } });
  const visit = await bookVisit({ proposalId: proposal.id, materialId: t.materialByKey[materialKey].id, mode, start, actor: { user: reception }, now });
  await confirmVisit({ user: reception }, visit.id);
  return { visit: (await Appointment.findByPk(visit.id))!, patient, proposal };
}

let templateId: string | undefined;
/** A signed and reviewed consent, so treatment may start (the consent guard checks it). */
async function reviewConsent(visit: Appointment) {
  templateId ??= (await ConsentTemplate.create({ clinicId: t.clinic.id, version: 1, title: "Test consent", sections: [], createdBy: t.staff.admin.id })).id;
  await Consent.create({
    clinicId: t.clinic.id, appointmentId: visit.id, patientId: visit.patientId, status: "reviewed", templateId, templateVersion: 1,
    answers: {} as never, acknowledged: [], electronicRecordsVersion: "test", consentText: "Consent text", textSha256: "a".repeat(64),
    typedName: "Test Patient", signaturePng: Buffer.from([137, 80, 78, 71]), signedAt: now, reviewedAt: now, reviewedBy: t.staff.dentist.id,
  });
}

async function stagesOf(visit: Appointment) {
  return AppointmentStage.findAll({ where: { appointmentId: visit.id }, order: [["seq", "ASC"]] });
}

/** Marks every tracked stage before `key` done on its planned times, as the dentist. */
async function runOnPlanUntil(visit: Appointment, key: string) {
  for (const s of await stagesOf(visit)) {
    if (s.key === key) return;
    if (s.actualEnd) continue;
    await markStage({ user: dentist, appointmentId: visit.id, key: s.key, mark: { action: "start", at: s.plannedStart.toISOString() } });
    await markStage({ user: dentist, appointmentId: visit.id, key: s.key, mark: { action: "finish", at: s.plannedEnd.toISOString() } });
  }
}

beforeAll(async () => {
  t = await createTestClinic({ chairs: 2, mills: 2, furnaces: 2 });
  reception = asUser(t.staff.reception);
  dentist = asUser(t.staff.dentist);
});

describe("visit progress", () => {
  it("checks the patient in, refuses treatment without a reviewed consent, then runs to completion", async () => {
    const { visit } = await book(wed0800);
    const stages = await stagesOf(visit);
    const checkIn = stages[0];

    const started = await markStage({ user: reception, appointmentId: visit.id, key: "check_in", mark: { action: "start", at: checkIn.plannedStart.toISOString() } });
    expect(started.status).toBe("checked_in");
    await markStage({ user: reception, appointmentId: visit.id, key: "check_in", mark: { action: "finish", at: checkIn.plannedEnd.toISOString() } });

    // Without a reviewed consent the guard refuses in_progress, and nothing is stored.
    const refused = await rejection(markStage({ user: dentist, appointmentId: visit.id, key: "anaesthesia", mark: { action: "start", at: checkIn.plannedEnd.toISOString() } }));
    expect(refused.status).toBe(409);
    expect(refused.message).toMatch(/[Cc]onsent/);
    expect((await stagesOf(visit))[1].actualStart).toBeNull();
    expect((await Appointment.findByPk(visit.id))!.status).toBe("checked_in");

    await reviewConsent(visit);
    const treating = await markStage({ user: dentist, appointmentId: visit.id, key: "anaesthesia", mark: { action: "start", at: checkIn.plannedEnd.toISOString() } });
    expect(treating.status).toBe("in_progress");
    await markStage({ user: dentist, appointmentId: visit.id, key: "anaesthesia", mark: { action: "finish", at: stages[1].plannedEnd.toISOString() } });

    await recordLot({ user: dentist, appointmentId: visit.id, body: { lot: "PROG-1" }, now });
    await runOnPlanUntil(visit, "cementation");
    const cementation = (await stagesOf(visit)).find((s) => s.key === "cementation")!;
    await markStage({ user: dentist, appointmentId: visit.id, key: "cementation", mark: { action: "start", at: cementation.plannedStart.toISOString() } });
    const done = await markStage({ user: dentist, appointmentId: visit.id, key: "cementation", mark: { action: "finish", at: cementation.plannedEnd.toISOString() } });
    expect(done.status).toBe("completed");

    const completion = await AuditEvent.findOne({ where: { subjectId: visit.id, action: "visit.completed" } });
    expect(completion!.data).toMatchObject({ lots: [{ lot: "PROG-1" }] });
    expect(await AuditEvent.count({ where: { subjectId: visit.id, action: "visit.stage_finished" } })).toBe((await stagesOf(visit)).filter((s) => s.key !== "aftercare").length);
  });

  it("refuses finishing a stage that was not started, marking a cancelled visit, and times off the visit's day", async () => {
    const { visit } = await book(new Date("2027-03-11T13:00:00Z"));
    const first = (await stagesOf(visit))[0];
    const notStarted = await rejection(markStage({ user: dentist, appointmentId: visit.id, key: "check_in", mark: { action: "finish", at: first.plannedEnd.toISOString() } }));
    expect([notStarted.status, notStarted.message]).toEqual([409, "The “Check-in” stage has not started, so it cannot be finished."]);

    const offDay = await rejection(markStage({ user: dentist, appointmentId: visit.id, key: "check_in", mark: { action: "start", at: "2027-03-12T14:00:00Z" } }));
    expect(offDay.status).toBe(422);

    const unknown = await rejection(markStage({ user: dentist, appointmentId: visit.id, key: "polishing", mark: { action: "start", at: first.plannedStart.toISOString() } }));
    expect(unknown.status).toBe(404);

    await cancelVisit({ user: reception }, visit.id, "Patient unwell", now);
    const cancelled = await rejection(markStage({ user: dentist, appointmentId: visit.id, key: "check_in", mark: { action: "start", at: first.plannedStart.toISOString() } }));
    expect(cancelled.status).toBe(409);
    expect(cancelled.message).toMatch(/cancelled/);
    expect((await stagesOf(visit)).every((s) => s.actualStart === null)).toBe(true);
    expect(await AuditEvent.count({ where: { subjectId: visit.id, action: "visit.stage_started" } })).toBe(0);
  });

  it("gives another clinic's staff a 404", async () => {
    const { visit } = await book(new Date("2027-03-12T13:00:00Z"));
    const other = await createTestClinic();
    const stranger = asUser(other.staff.dentist);
    expect((await rejection(markStage({ user: stranger, appointmentId: visit.id, key: "check_in", mark: { action: "start" } }))).status).toBe(404);
    expect((await rejection(recordLot({ user: stranger, appointmentId: visit.id, body: { lot: "X1" } }))).status).toBe(404);
    expect((await rejection(loadVisitProgress({ user: stranger, appointmentId: visit.id }))).status).toBe(404);
  });
});

describe("the day board", () => {
  it("shifts the next visit on the same mill when milling finishes late, and flags it with a proposal", async () => {
    // A at 08:00; B at 08:15 with a second dentist, so B's milling comes just after A's.
    const a = await book(new Date("2027-03-15T12:00:00Z"), "zirconia", "standard", "Ada Mill");
    const { patient } = await createTestPatient(t.clinic.id, "Ben Mill");
    const proposal = await createTestProposal(t, patient.id, { allow: { zirconia: ["standard"] } });
    await proposal.update({ dentistId: (await createUser(t.clinic.id, "dentist", "Second dentist")).id });
    const bookedB = await bookVisit({ proposalId: proposal.id, materialId: t.materialByKey.zirconia.id, mode: "standard", start: new Date("2027-03-15T12:15:00Z"), actor: { user: reception }, now });
    await confirmVisit({ user: reception }, bookedB.id);
    const b = (await Appointment.findByPk(bookedB.id))!;
    expect(b.millId).toBe(a.visit.millId);
    await reviewConsent(a.visit);

    const bFab = (await stagesOf(b)).find((s) => s.key === "fabrication")!;
    await runOnPlanUntil(a.visit, "fabrication");
    const aFab = (await stagesOf(a.visit)).find((s) => s.key === "fabrication")!;
    expect(aFab.plannedEnd.getTime()).toBeLessThanOrEqual(bFab.plannedStart.getTime());
    const lateEnd = new Date(bFab.plannedStart.getTime() + 20 * MIN);
    await markStage({ user: dentist, appointmentId: a.visit.id, key: "fabrication", mark: { action: "start", at: aFab.plannedStart.toISOString() } });
    await markStage({ user: dentist, appointmentId: a.visit.id, key: "fabrication", mark: { action: "finish", at: lateEnd.toISOString() } });

    const board = await loadBoard({ clinicId: t.clinic.id, day: "2027-03-15", now });
    expect(board.timezone).toBe("America/Toronto");
    expect(board.lanes.map((l) => l.kind)).toEqual(["chair", "chair", "mill", "mill", "furnace", "furnace"]);
    const onBoardB = board.visits.find((v) => v.id === b.id)!;
    const shifted = onBoardB.stages.find((s) => s.key === "fabrication")!;
    expect(new Date(shifted.start).getTime()).toBe(lateEnd.getTime());
    expect(shifted.shiftMinutes).toBe(20);
    expect(onBoardB.delayMinutes).toBeGreaterThanOrEqual(20);
    // Times come in the clinic's zone, with its offset (EDT from 14 March 2027).
    expect(shifted.start).toMatch(/-04:00$/);

    const flag = board.conflicts.find((c) => c.visitId === b.id && c.stageKey === "fabrication")!;
    expect(flag).toMatchObject({ resourceKind: "mill", resourceId: a.visit.millId, blockedByVisitId: a.visit.id, waitMinutes: 20 });
    const otherMill = board.lanes.find((l) => l.kind === "mill" && l.id !== a.visit.millId)!;
    // The other mill is free at B's planned milling time, so it is proposed.
    expect(flag.switchTo).toMatchObject({ laneId: otherMill.id, name: otherMill.name });
    expect(flag.proposal).toContain(`Use ${otherMill.name}`);

    const progress = await loadVisitProgress({ user: dentist, appointmentId: a.visit.id, now });
    expect(progress.conflicts.map((c) => c.visitId)).toContain(b.id);
  });

  it("refuses a day that is not a date", async () => {
    expect((await rejection(loadBoard({ clinicId: t.clinic.id, day: "2027-02-30" }))).status).toBe(400);
    expect((await rejection(loadBoard({ clinicId: t.clinic.id, day: "tomorrow" }))).status).toBe(400);
  });
});

describe("crown block lots", () => {
  it("records a lot from a GS1 code in either form, or typed, and finds the patients for a recall", async () => {
    const lot = `RC-${randomUUID().slice(0, 6).toUpperCase()}`;
    const one = await book(new Date("2027-03-16T13:00:00Z"), "zirconia", "standard", "Recall One");
    const two = await book(new Date("2027-03-17T13:00:00Z"), "zirconia", "standard", "Recall Two");

    // [M] from memory: 09501101530003 is GS1's example GTIN (check digit 3 by the published rule).
    const printed = await recordLot({ user: dentist, appointmentId: one.visit.id, body: { elementString: `(01)09501101530003(17)281200(10)${lot}(21)S-77` }, now });
    expect(printed).toEqual({ gtin: "09501101530003", lot, expiry: "2028-12-31", serial: "S-77" });
    const scanned = await recordLot({ user: reception, appointmentId: two.visit.id, body: { elementString: `0109501101530003172806301` + `0${lot.toLowerCase()}${GROUP_SEPARATOR}21S-78` }, now });
    expect(scanned).toEqual({ gtin: "09501101530003", lot: lot.toLowerCase(), expiry: "2028-06-30", serial: "S-78" });
    expect(await recordLot({ user: dentist, appointmentId: two.visit.id, body: { lot: " HAND-1 " }, now })).toEqual({ lot: "HAND-1" });

    const recall = await findPatientsByLot({ clinicId: t.clinic.id, lot: ` ${lot.toLowerCase()} ` });
    expect(recall.map((r) => r.patientName).sort()).toEqual(["Recall One", "Recall Two"]);
    expect(recall[0]).toMatchObject({ gtin: "09501101530003", material: "Zirconia" });
    expect(await findPatientsByLot({ clinicId: (await createTestClinic()).clinic.id, lot })).toEqual([]);

    expect((await listLotsForVisit({ clinicId: t.clinic.id, appointmentId: two.visit.id })).map((l) => l.lot)).toEqual([lot.toLowerCase(), "HAND-1"]);
    expect((await listLotsForPatient({ clinicId: t.clinic.id, patientId: one.patient.id }))[0]).toMatchObject({ lot, expiry: "2028-12-31", tooth: expect.stringContaining("36") });
    const audit = await AuditEvent.findOne({ where: { subjectId: one.visit.id, action: "visit.lot_recorded" } });
    expect(audit!.data).toMatchObject({ lot, gtin: "09501101530003" });
  });

  it("refuses a bad check digit and an expired block with 422, storing nothing", async () => {
    const { visit } = await book(new Date("2027-03-18T13:00:00Z"));
    const bad = await rejection(recordLot({ user: dentist, appointmentId: visit.id, body: { elementString: "(01)09501101530004(10)BAD1" }, now }));
    expect([bad.status, bad.message]).toEqual([422, expect.stringMatching(/check digit/)]);
    // "Today" is the clinic's date: 2027-03-01 in Toronto.
    const expired = await rejection(recordLot({ user: dentist, appointmentId: visit.id, body: { elementString: "(01)09501101530003(17)270228(10)OLD1" }, now }));
    expect([expired.status, expired.message]).toEqual([422, expect.stringMatching(/expired on 2027-02-28/)]);
    const malformed = await rejection(recordLot({ user: dentist, appointmentId: visit.id, body: { elementString: "(01)0950(10)X" }, now }));
    expect(malformed.status).toBe(422);
    expect(await BlockLot.count({ where: { appointmentId: visit.id } })).toBe(0);
    expect(await AuditEvent.count({ where: { subjectId: visit.id, action: "visit.lot_recorded" } })).toBe(0);

    await cancelVisit({ user: reception }, visit.id, undefined, now);
    expect((await rejection(recordLot({ user: dentist, appointmentId: visit.id, body: { lot: "AFTER1" }, now }))).status).toBe(409);
  });
});

describe("equipment out of service", () => {
  it("refuses a range that ends before it starts, and stores nothing", async () => {
    const mill = t.equipment.find((e) => e.kind === "mill")!;
    const before = await EquipmentOutage.count({ where: { equipmentId: mill.id } });
    const err = await createOutage({ user: reception, input: { equipmentId: mill.id, start: "2027-03-19T12:00", end: "2027-03-19T09:00" } }).then(() => null, (e) => e);
    expect(err?.issues?.[0]).toMatchObject({ path: ["end"], message: "The out-of-service range must end after it starts." });
    expect(await EquipmentOutage.count({ where: { equipmentId: mill.id } })).toBe(before);
  });

  it("lists the booked visits on it, flags them on the board, and keeps availability off it", async () => {
    const single = await createTestClinic({ chairs: 2, mills: 1, furnaces: 1 });
    const staff = asUser(single.staff.reception);
    const { patient } = await createTestPatient(single.clinic.id, "Out Of Service");
    const proposal = await createTestProposal(single, patient.id, { allow: { zirconia: ["standard"] } });
    const visit = await bookVisit({ proposalId: proposal.id, materialId: single.materialByKey.zirconia.id, mode: "standard", start: wed0800, actor: { user: staff }, now });
    const mill = single.equipment.find((e) => e.kind === "mill")!;

    const created = await createOutage({ user: staff, input: { equipmentId: mill.id, start: `${DAY}T08:00`, end: `${DAY}T13:00`, reason: "Spindle service" } });
    expect(created.start).toBe("2027-03-10T08:00:00-05:00");
    expect(created.affected.map((v) => v.id)).toEqual([visit.id]);
    expect(created.affected[0].stages).toEqual(["fabrication"]);
    const listed = await listOutages({ clinicId: single.clinic.id, now });
    expect(listed[0]).toMatchObject({ equipmentName: mill.name, reason: "Spindle service", current: false });
    expect(await AuditEvent.count({ where: { subjectId: mill.id, action: "equipment.out_of_service" } })).toBe(1);

    const board = await loadBoard({ clinicId: single.clinic.id, day: DAY, now });
    expect(board.lanes.find((l) => l.id === mill.id)!.outages).toHaveLength(1);
    const flag = board.conflicts.find((c) => c.visitId === visit.id)!;
    expect(flag).toMatchObject({ stageKey: "fabrication", blockedByVisitId: null, switchTo: null });
    expect(flag.message).toContain("out of service");

    // No slot that day may mill before 13:00 clinic time (18:00 UTC).
    const { patient: p2 } = await createTestPatient(single.clinic.id);
    const prop2 = await createTestProposal(single, p2.id, { allow: { zirconia: ["rapid"] } });
    const { slots } = await searchSlots({ proposal: prop2, materialId: single.materialByKey.zirconia.id, mode: "rapid", from: DAY, days: 1, now });
    const { timeline } = await loadTimeline({ clinicId: single.clinic.id, materialId: single.materialByKey.zirconia.id, mode: "rapid", tooth: 36 });
    const millAt = timeline.stages.find((s) => s.key === "fabrication")!.startMin * MIN;
    expect(slots.length).toBeGreaterThan(0);
    for (const s of slots) expect(s.start.getTime() + millAt).toBeGreaterThanOrEqual(new Date("2027-03-10T18:00:00Z").getTime());

    // Back in service before it starts: removed.
    await endOutage({ user: staff, outageId: String(created.id), now });
    expect(await EquipmentOutage.count({ where: { equipmentId: mill.id } })).toBe(0);
  });
});

describe("estimated against actual", () => {
  it("summarises finished stages per material and mode", async () => {
    const stats = await stageTimeStats({ clinicId: t.clinic.id });
    const checkIn = stats.find((s) => s.material === "Zirconia" && s.mode === "standard" && s.stage === "check_in")!;
    expect(checkIn.count).toBeGreaterThanOrEqual(2);
    expect(checkIn.medianMinutes).toBe(checkIn.estimatedMinutes);
    const fab = stats.find((s) => s.material === "Zirconia" && s.mode === "standard" && s.stage === "fabrication")!;
    // One milling ran on plan (12 min), the late one ran longer.
    expect(fab.maxMinutes).toBeGreaterThan(fab.estimatedMinutes);
    expect(fab.currentMinutes).toBe(12);
  });
});
