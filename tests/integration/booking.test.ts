// Booking against the real PostgreSQL: reservations, the exclusion constraint, concurrency, state changes.
import { ExclusionConstraintError } from "sequelize";
import { beforeAll, describe, expect, it } from "vitest";
import { Appointment, AppointmentStage, AuditEvent, Reservation } from "@/db/models";
import { bookVisit } from "@/lib/booking/book";
import { searchSlots } from "@/lib/booking/search";
import { cancelVisit, confirmVisit, declineVisit, moveVisit } from "@/lib/booking/transitions";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";
import { sessionOf as asUser } from "../support/session";

const now = new Date("2027-03-01T12:00:00Z");
// Wednesday 2027-03-10, 08:00 in Toronto (EST, UTC−5).
const wed0800 = new Date("2027-03-10T13:00:00Z");

let t: TestClinic;

async function patientWithProposal(allow?: Record<string, ("rapid" | "standard" | "refined")[]>) {
  const { user, patient } = await createTestPatient(t.clinic.id);
  const proposal = await createTestProposal(t, patient.id, { allow });
  return { actor: { user: asUser(user) }, patient, proposal };
}

async function rejection(p: Promise<unknown>): Promise<AppError> {
  const err = await p.then(() => null, (e) => e);
  expect(err).toBeInstanceOf(AppError);
  return err as AppError;
}

beforeAll(async () => {
  t = await createTestClinic({ chairs: 2, mills: 1, furnaces: 1 });
});

describe("booking a visit", () => {
  it("writes the visit, its stages and one reservation per resource per stage window", async () => {
    const { actor, proposal } = await patientWithProposal();
    const zr = t.materialByKey["zirconia"];
    const visit = await bookVisit({ proposalId: proposal.id, materialId: zr.id, mode: "standard", start: wed0800, actor, now });
    expect(visit.status).toBe("requested");
    const stages = await AppointmentStage.findAll({ where: { appointmentId: visit.id }, order: [["seq", "ASC"]] });
    expect(stages.map((s) => s.key)).toEqual(["check_in", "anaesthesia", "preparation", "scan", "design", "fabrication", "heat_treatment", "finishing", "glaze_firing", "try_in", "cementation", "aftercare"]);
    const reservations = await Reservation.findAll({ where: { appointmentId: visit.id } });
    const expected = stages.reduce((n, s) => n + s.equipment.length, 0);
    expect(reservations).toHaveLength(expected);
    expect(new Set(reservations.filter((r) => r.resourceKind === "chair").map((r) => r.resourceId)).size).toBe(1);
    expect(reservations.find((r) => r.resourceKind === "mill")!.stage).toBe("fabrication");
    // Sintering and the glaze firing both hold the furnace.
    expect(reservations.filter((r) => r.resourceKind === "furnace").map((r) => r.stage).sort()).toEqual(["glaze_firing", "heat_treatment"]);
    const audit = await AuditEvent.findOne({ where: { subjectId: visit.id, action: "visit.requested" } });
    expect(audit).not.toBeNull();

    // The same proposal cannot get a second active visit.
    const again = await rejection(bookVisit({ proposalId: proposal.id, materialId: zr.id, mode: "standard", start: new Date("2027-03-11T13:00:00Z"), actor, now }));
    expect(again.status).toBe(409);
    expect(again.message).toMatch(/already has a visit/);
  });

  it("lets exactly one of many concurrent requests for the same time win; the others get 409 with alternatives", async () => {
    const people = await Promise.all(Array.from({ length: 8 }, () => patientWithProposal()));
    const start = new Date("2027-03-11T13:00:00Z");
    const ld = t.materialByKey["lithium-disilicate"];
    const results = await Promise.allSettled(people.map((p) => bookVisit({ proposalId: p.proposal.id, materialId: ld.id, mode: "standard", start, actor: p.actor, now })));
    const won = results.filter((r) => r.status === "fulfilled");
    const lost = results.filter((r): r is PromiseRejectedResult => r.status === "rejected");
    expect(won).toHaveLength(1);
    expect(lost).toHaveLength(7);
    for (const l of lost) {
      expect(l.reason).toBeInstanceOf(AppError);
      expect(l.reason.status).toBe(409);
      const alternatives = l.reason.options.extra.alternatives as { start: string }[];
      expect(alternatives.length).toBeGreaterThan(0);
      for (const a of alternatives) expect(a.start).toMatch(/^2027-03-\d\dT\d\d:\d\d:00-05:00$/);
    }
    const booked = await Appointment.count({ where: { clinicId: t.clinic.id, startsAt: start } });
    expect(booked).toBe(1);
  });

  it("refuses overlapping reservations in the database itself (exclusion constraint)", async () => {
    const existing = await Reservation.findOne({ where: { clinicId: t.clinic.id, resourceKind: "mill", active: true } });
    const [a, b] = existing!.during as [{ value: Date }, { value: Date }];
    const err = await Reservation.create({
      appointmentId: existing!.appointmentId, clinicId: t.clinic.id, resourceKind: "mill", resourceId: existing!.resourceId, stage: "fabrication",
      during: [new Date(a.value.getTime() + 60_000), new Date(b.value.getTime() + 60_000)],
    }).then(() => null, (e) => e);
    expect(err).toBeInstanceOf(ExclusionConstraintError);
  });

  it("refuses bad times and options with a clear 4xx and writes nothing", async () => {
    const { actor, proposal } = await patientWithProposal();
    const zr = t.materialByKey["zirconia"];
    const before = await Appointment.count({ where: { clinicId: t.clinic.id } });
    const cases: [() => Promise<unknown>, number, RegExp][] = [
      [() => bookVisit({ proposalId: proposal.id, materialId: zr.id, mode: "standard", start: new Date("2027-03-10T13:05:00Z"), actor, now }), 400, /not a bookable start time/],
      [() => bookVisit({ proposalId: proposal.id, materialId: zr.id, mode: "standard", start: new Date("2027-03-10T02:00:00Z"), actor, now }), 400, /not a bookable/],
      [() => bookVisit({ proposalId: proposal.id, materialId: zr.id, mode: "standard", start: new Date("2027-02-01T14:00:00Z"), actor, now }), 400, /already passed/],
      [() => bookVisit({ proposalId: proposal.id, materialId: zr.id, mode: "refined", start: wed0800, actor, now }), 422, /refined/],
      [() => bookVisit({ proposalId: proposal.id, materialId: t.materialByKey["pmma"].id, mode: "rapid", start: wed0800, actor, now }), 422, /does not offer that material/],
    ];
    for (const [p, status, message] of cases) {
      const err = await rejection(p());
      expect(err.status).toBe(status);
      expect(err.message).toMatch(message);
    }
    expect(await Appointment.count({ where: { clinicId: t.clinic.id } })).toBe(before);
  });

  it("hides another patient's proposal behind a 404", async () => {
    const mine = await patientWithProposal();
    const theirs = await patientWithProposal();
    const err = await rejection(bookVisit({ proposalId: theirs.proposal.id, materialId: t.materialByKey["zirconia"].id, mode: "rapid", start: wed0800, actor: mine.actor, now }));
    expect(err.status).toBe(404);
  });
});

describe("visit state changes", () => {
  it("confirms, declines (freeing the time), moves and cancels with audit events", async () => {
    const reception = { user: asUser(t.staff.reception) };
    const a = await patientWithProposal({ "feldspathic-ceramic": ["rapid"] });
    const feld = t.materialByKey["feldspathic-ceramic"];
    const friday = new Date("2027-03-12T18:30:00Z"); // 13:30 local
    const visit = await bookVisit({ proposalId: a.proposal.id, materialId: feld.id, mode: "rapid", start: friday, actor: a.actor, now });

    expect((await confirmVisit(reception, visit.id)).status).toBe("confirmed");
    expect((await rejection(confirmVisit(reception, visit.id))).status).toBe(409);
    // Patients cannot confirm their own visit.
    expect((await rejection(confirmVisit(a.actor, visit.id))).status).toBe(403);

    // Move by reception keeps it confirmed and replaces the reservations.
    const later = new Date("2027-03-12T19:00:00Z");
    const moved = await moveVisit(reception, visit.id, later, now);
    expect(moved.status).toBe("confirmed");
    expect(moved.startsAt.toISOString()).toBe(later.toISOString());
    const chairRows = await Reservation.findAll({ where: { appointmentId: visit.id, resourceKind: "chair" }, order: [["id", "ASC"]] });
    expect((chairRows[0].during as unknown as [{ value: Date }])[0].value.toISOString()).toBe(later.toISOString());

    // Within the 24 h cut-off the patient cannot cancel online; well before it they can.
    const lateNow = new Date(later.getTime() - 3 * 3_600_000);
    expect((await rejection(cancelVisit(a.actor, visit.id, undefined, lateNow))).message).toMatch(/24 hours/);
    expect((await cancelVisit(a.actor, visit.id, "Travelling", now)).status).toBe("cancelled");
    expect(await Reservation.count({ where: { appointmentId: visit.id, active: true } })).toBe(0);

    // A declined visit frees its time for someone else.
    const b = await patientWithProposal({ "feldspathic-ceramic": ["rapid"] });
    const c = await patientWithProposal({ "feldspathic-ceramic": ["rapid"] });
    const vb = await bookVisit({ proposalId: b.proposal.id, materialId: feld.id, mode: "rapid", start: later, actor: b.actor, now });
    expect((await rejection(bookVisit({ proposalId: c.proposal.id, materialId: feld.id, mode: "rapid", start: later, actor: c.actor, now }))).status).toBe(409);
    const slotsWhileTaken = await searchSlots({ proposal: c.proposal, materialId: feld.id, mode: "rapid", from: "2027-03-12", days: 1, now });
    expect(slotsWhileTaken.slots.map((s) => s.start.toISOString())).not.toContain(later.toISOString());
    expect((await declineVisit(reception, vb.id, "The dentist is away that afternoon.")).status).toBe("declined");
    expect(await Reservation.count({ where: { appointmentId: vb.id, active: true } })).toBe(0);
    const vc = await bookVisit({ proposalId: c.proposal.id, materialId: feld.id, mode: "rapid", start: later, actor: c.actor, now });
    expect(vc.status).toBe("requested");
    const actions = (await AuditEvent.findAll({ where: { subjectId: visit.id }, order: [["id", "ASC"]] })).map((e) => e.action);
    expect(actions).toEqual(["visit.requested", "visit.confirmed", "visit.moved", "visit.cancelled"]);
  });
});
