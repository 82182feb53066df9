// The mill preparation list against the real PostgreSQL: shade and block size, the loaded mark, the
// recorded lot, and load times that follow a late day.
import { beforeAll, describe, expect, it } from "vitest";
import { Appointment, AuditEvent } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { bookVisit } from "@/lib/booking/book";
import { confirmVisit } from "@/lib/booking/transitions";
import { loadBoard } from "@/lib/data/board";
import { recordLot } from "@/lib/data/lots";
import { loadMillPrep, markBlockLoaded, recordVisitBlock } from "@/lib/data/mill-prep";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";
import { sessionOf } from "../support/session";

const now = new Date("2027-03-01T12:00:00Z");
let t: TestClinic;
let dentist: SessionUser;
let reception: SessionUser;
const asUser = sessionOf;

beforeAll(async () => {
  t = await createTestClinic({ chairs: 2, mills: 1, furnaces: 1 });
  dentist = asUser(t.staff.dentist);
  reception = asUser(t.staff.reception);
});

async function book(start: Date) {
  const { patient } = await createTestPatient(t.clinic.id);
  const p = await createTestProposal(t, patient.id, { allow: { "resin-ceramic-hybrid": ["standard"] } });
  const v = await bookVisit({ proposalId: p.id, materialId: t.materialByKey["resin-ceramic-hybrid"].id, mode: "standard", start, actor: { user: reception }, now });
  await confirmVisit({ user: reception }, v.id);
  return (await Appointment.findByPk(v.id))!;
}

describe("mill preparation", () => {
  it("lists each mill's blocks in cutting order with shade, size, load window, loaded mark and lot", async () => {
    const first = await book(new Date("2027-03-10T13:00:00Z")); // 08:00 Toronto: mills 09:10–09:22
    const second = await book(new Date("2027-03-10T18:30:00Z")); // 13:30 Toronto: mills 14:40–14:52

    await recordVisitBlock({ user: dentist, input: { appointmentId: first.id, shade: "A3.5", blockSize: "14L" } });
    // [P] VITA classical shade guide: there is no D1 tab.
    const bad = await recordVisitBlock({ user: dentist, input: { appointmentId: second.id, shade: "D1", blockSize: "12" } }).then(() => null, (e) => e);
    expect((bad as { issues?: unknown[] }).issues).toBeDefined();
    const byReception = await recordVisitBlock({ user: reception, input: { appointmentId: second.id, shade: "A2", blockSize: "12" } }).then(() => null, (e) => e);
    expect((byReception as AppError).status).toBe(403);

    await markBlockLoaded({ user: reception, input: { appointmentId: first.id, loaded: "yes" }, now: new Date("2027-03-10T14:00:00Z") });
    await recordLot({ user: dentist, appointmentId: first.id, body: { lot: "PREP-7" }, now });

    const prep = await loadMillPrep({ user: reception, day: "2027-03-10", now: new Date("2027-03-10T14:05:00Z") });
    const items = prep.mills[0].items;
    expect(items.map((i) => i.id)).toEqual([first.id, second.id]);
    expect(items[0]).toMatchObject({ shade: "A3.5", blockSize: "14L", state: "loaded", lots: ["PREP-7"], loadFrom: null, loadBy: new Date("2027-03-10T14:10:00Z").getTime() });
    expect(items[1]).toMatchObject({ shade: null, state: "due", missing: ["shade", "block size"], loadFrom: new Date("2027-03-10T14:22:00Z").getTime() });
    expect(await AuditEvent.count({ where: { subjectId: first.id, action: "visit.block_loaded" } })).toBe(1);
    // The day board carries the mark and the shade.
    const board = await loadBoard({ clinicId: t.clinic.id, day: "2027-03-10", now: new Date("2027-03-10T14:05:00Z") });
    expect(board.visits.find((v) => v.id === first.id)!.block).toMatchObject({ shade: "A3.5", size: "14L" });
    expect(board.visits.find((v) => v.id === first.id)!.block.loadedAt).not.toBeNull();
    expect(board.visits.find((v) => v.id === second.id)!.block.loadedAt).toBeNull();
    expect(await AuditEvent.count({ where: { subjectId: first.id, action: "visit.block_planned" } })).toBe(1);
  });

  it("gives another clinic's staff a 404 and refuses a loaded mark on a cancelled visit", async () => {
    const v = await book(new Date("2027-03-11T13:00:00Z"));
    const other = await createTestClinic();
    const err = await markBlockLoaded({ user: asUser(other.staff.reception), input: { appointmentId: v.id, loaded: "yes" } }).then(() => null, (e) => e);
    expect((err as AppError).status).toBe(404);
    await v.update({ status: "cancelled" });
    const cancelled = await markBlockLoaded({ user: reception, input: { appointmentId: v.id, loaded: "yes" } }).then(() => null, (e) => e);
    expect((cancelled as AppError).status).toBe(409);
  });
});
