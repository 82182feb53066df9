// Which visits the day board shows: those whose [start, end) overlaps the clinic-local day, read
// by one range overlap in the database; their stages in order and their material by name.
import { beforeAll, describe, expect, it } from "vitest";
import { Appointment, AppointmentStage } from "@/db/models";
import { loadBoard } from "@/lib/data/board";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";

const DAY = "2027-03-10"; // Toronto is on EST (UTC−5) then: the day runs 05:00Z to 05:00Z the next day
const dayStart = new Date("2027-03-10T05:00:00Z");
const dayEnd = new Date("2027-03-11T05:00:00Z");
const MIN = 60_000;

let t: TestClinic;
let other: TestClinic;

async function visit(clinic: TestClinic, startsAt: Date, minutes: number, status: Appointment["status"] = "confirmed") {
  const { patient } = await createTestPatient(clinic.clinic.id, "Window Patient");
  const proposal = await createTestProposal(clinic, patient.id);
  return Appointment.create({
    clinicId: clinic.clinic.id, proposalId: proposal.id, patientId: patient.id, dentistId: clinic.staff.dentist.id,
    materialId: clinic.materialByKey["zirconia"].id, mode: "standard", tooth: 36, status, startsAt,
    endsAt: new Date(startsAt.getTime() + minutes * MIN), chairId: clinic.equipment[0].id, millId: clinic.equipment.find((e) => e.kind === "mill")!.id,
    furnaceId: null, feeCents: 120000, createdBy: null,
  });
}

let inside: Appointment, acrossMidnight: Appointment, endsAtStart: Appointment, startsAtEnd: Appointment, cancelled: Appointment, lastMinute: Appointment;

beforeAll(async () => {
  t = await createTestClinic();
  other = await createTestClinic();
  endsAtStart = await visit(t, new Date(dayStart.getTime() - 60 * MIN), 60); // 23:00–00:00 the day before
  acrossMidnight = await visit(t, new Date(dayStart.getTime() - 30 * MIN), 60); // 23:30–00:30
  inside = await visit(t, new Date("2027-03-10T15:00:00Z"), 90);
  cancelled = await visit(t, new Date("2027-03-10T17:00:00Z"), 60, "cancelled");
  lastMinute = await visit(t, new Date(dayEnd.getTime() - MIN), 60); // 23:59–00:59
  startsAtEnd = await visit(t, dayEnd, 60); // 00:00 the next day
  await visit(other, new Date("2027-03-10T15:00:00Z"), 90);
  // Stages written out of order: the board must still list them by their sequence.
  const stage = (seq: number, key: string, from: number, to: number) => ({
    appointmentId: inside.id, seq, key, plannedStart: new Date(inside.startsAt.getTime() + from * MIN), plannedEnd: new Date(inside.startsAt.getTime() + to * MIN), equipment: ["chair"],
  });
  await AppointmentStage.bulkCreate([stage(3, "cementation", 60, 90), stage(1, "preparation", 0, 30), stage(2, "fabrication", 30, 60)] as never);
});

describe("the day board's window", () => {
  it("shows the visits that overlap the local day, in start order, and no others", async () => {
    const board = await loadBoard({ clinicId: t.clinic.id, day: DAY, now: new Date("2027-03-01T12:00:00Z") });
    expect(board.visits.map((v) => v.id)).toEqual([acrossMidnight.id, inside.id, lastMinute.id]);
    for (const away of [endsAtStart, startsAtEnd, cancelled]) expect(board.visits.map((v) => v.id)).not.toContain(away.id);
  });

  it("lists each visit's stages in sequence, with its material's name", async () => {
    const board = await loadBoard({ clinicId: t.clinic.id, day: DAY, now: new Date("2027-03-01T12:00:00Z") });
    const shown = board.visits.find((v) => v.id === inside.id)!;
    expect(shown.stages.map((s) => s.key)).toEqual(["preparation", "fabrication", "cementation"]);
    expect(shown.material).toBe(t.materialByKey["zirconia"].name);
    expect(shown.plannedStart).toBe("2027-03-10T10:00:00-05:00");
  });

  it("shows the visit that crosses midnight on the board of the day it starts as well", async () => {
    const board = await loadBoard({ clinicId: t.clinic.id, day: "2027-03-09", now: new Date("2027-03-01T12:00:00Z") });
    expect(board.visits.map((v) => v.id)).toEqual([endsAtStart.id, acrossMidnight.id]);
  });
});
