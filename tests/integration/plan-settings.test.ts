// The clinic manager's visit-plan settings against the real PostgreSQL: stage orders within the safe
// rules, furnace programmes and their effect on what is offered and where it is planned.
import { beforeAll, describe, expect, it } from "vitest";
import { AuditEvent, Material, MaterialMode, Reservation } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { bookVisit } from "@/lib/booking/book";
import { loadTimeline } from "@/lib/booking/context";
import { searchSlots } from "@/lib/booking/search";
import { materialEstimates } from "@/lib/data/materials";
import { deleteFurnaceProgramme, getPlanSettings, saveFiringAssignments, saveFurnaceProgramme, saveStageOrder } from "@/lib/data/plan-settings";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";
import { sessionOf } from "../support/session";

const now = new Date("2027-03-01T12:00:00Z");
let t: TestClinic;
let admin: SessionUser;
let reception: SessionUser;
const asUser = sessionOf;

async function rejection(p: Promise<unknown>): Promise<AppError> {
  const err = await p.then(() => null, (e) => e);
  expect(err).toBeInstanceOf(AppError);
  return err as AppError;
}

beforeAll(async () => {
  t = await createTestClinic({ chairs: 2, mills: 1, furnaces: 2 });
  admin = asUser(t.staff.admin);
  reception = asUser(t.staff.reception);
});

describe("stage orders", () => {
  it("saves an order within the rules, audited, and new plans follow it", async () => {
    const zr = t.materialByKey["zirconia"];
    // Polish or glaze after try-in is allowed for a sintered crown as long as try-in follows sintering.
    const order = ["check_in", "anaesthesia", "preparation", "scan", "design", "fabrication", "heat_treatment", "try_in", "finishing", "glaze_firing", "cementation", "aftercare"];
    await saveStageOrder({ user: admin }, { materialId: zr.id, order });
    expect((await Material.findByPk(zr.id))!.stageOrder).toEqual(order);
    expect(await AuditEvent.count({ where: { subjectId: zr.id, action: "settings.stage_order" } })).toBe(1);
    const { timeline } = await loadTimeline({ clinicId: t.clinic.id, materialId: zr.id, mode: "standard", tooth: 36 });
    expect(timeline.stages.map((s) => s.key).slice(5)).toEqual(order.slice(5));
  });

  it("refuses an order that breaks a rule with 422, changing nothing", async () => {
    const ld = t.materialByKey["lithium-disilicate"];
    const before = (await Material.findByPk(ld.id))!.stageOrder;
    const bad = ["check_in", "anaesthesia", "preparation", "scan", "design", "fabrication", "cementation", "try_in", "finishing", "heat_treatment", "aftercare"];
    const err = await rejection(saveStageOrder({ user: admin }, { materialId: ld.id, order: bad }));
    expect(err.status).toBe(422);
    expect(err.message).toMatch(/Cementation comes after/);
    expect((await Material.findByPk(ld.id))!.stageOrder).toEqual(before);
  });

  it("lets only the clinic manager change it, and gives another clinic's material a 404", async () => {
    const ld = t.materialByKey["lithium-disilicate"];
    expect((await rejection(saveStageOrder({ user: reception }, { materialId: ld.id, order: ld.stageOrder }))).status).toBe(403);
    const other = await createTestClinic();
    const err = await rejection(saveStageOrder({ user: asUser(other.staff.admin) }, { materialId: ld.id, order: ld.stageOrder }));
    expect(err.status).toBe(404);
  });
});

describe("furnace programmes", () => {
  it("plans a rapid zirconia only on the furnace that can speed-sinter, for the programme's minutes", async () => {
    const [slow, fast] = t.equipment.filter((e) => e.kind === "furnace");
    const speedId = await saveFurnaceProgramme({ user: admin }, { name: "Speed sinter", minutes: 25, furnaceIds: [fast.id] });
    const zrRapid = (await MaterialMode.findOne({ where: { materialId: t.materialByKey["zirconia"].id, mode: "rapid" } }))!;
    await saveFiringAssignments({ user: admin }, { modes: [{ id: zrRapid.id, heatProgrammeId: speedId, glazeProgrammeId: "", glazeFiringMinutes: 0 }] });

    const { timeline, furnaceIds } = await loadTimeline({ clinicId: t.clinic.id, materialId: t.materialByKey["zirconia"].id, mode: "rapid", tooth: 36 });
    const heat = timeline.stages.find((s) => s.key === "heat_treatment")!;
    expect(heat.endMin - heat.startMin).toBe(25);
    expect(furnaceIds).toEqual([fast.id]);

    const { patient } = await createTestPatient(t.clinic.id);
    const proposal = await createTestProposal(t, patient.id, { allow: { zirconia: ["rapid"] } });
    const { slots } = await searchSlots({ proposal, materialId: t.materialByKey["zirconia"].id, mode: "rapid", from: "2027-03-10", days: 1, now });
    expect(slots.length).toBeGreaterThan(0);
    for (const s of slots) expect(s.assignment.furnace).toBe(fast.id);
    const visit = await bookVisit({ proposalId: proposal.id, materialId: t.materialByKey["zirconia"].id, mode: "rapid", start: slots[0].start, actor: { user: reception }, now });
    const furnace = await Reservation.findAll({ where: { appointmentId: visit.id, resourceKind: "furnace" } });
    expect(furnace.map((r) => r.resourceId)).toEqual([fast.id]);
    expect(slow.id).not.toBe(fast.id);
  });

  it("does not offer rapid zirconia at a clinic whose only speed furnace is retired", async () => {
    const fast = t.equipment.filter((e) => e.kind === "furnace")[1];
    await fast.update({ active: false });
    try {
      const err = await rejection(loadTimeline({ clinicId: t.clinic.id, materialId: t.materialByKey["zirconia"].id, mode: "rapid", tooth: 36 }));
      expect(err.status).toBe(422);
      expect(err.message).toMatch(/“Speed sinter”/);
      const estimates = await materialEstimates({ clinicId: t.clinic.id });
      expect(estimates[t.materialByKey["zirconia"].id].rapid!.problem).toMatch(/Speed sinter/);
      expect(estimates[t.materialByKey["zirconia"].id].standard!.problem).toBeNull();
    } finally {
      await fast.update({ active: true });
    }
  });

  it("refuses another clinic's furnace in a programme, and removing a programme frees its firings", async () => {
    const other = await createTestClinic();
    const foreign = other.equipment.find((e) => e.kind === "furnace")!;
    expect((await rejection(saveFurnaceProgramme({ user: admin }, { name: "Foreign", minutes: 10, furnaceIds: [foreign.id] }))).status).toBe(422);
    const plan = await getPlanSettings({ clinicId: t.clinic.id });
    const speed = plan.programmes.find((p) => p.name === "Speed sinter")!;
    await deleteFurnaceProgramme({ user: admin }, speed.id);
    const zrRapid = (await MaterialMode.findOne({ where: { materialId: t.materialByKey["zirconia"].id, mode: "rapid" } }))!;
    expect(zrRapid.heatProgrammeId).toBeNull();
  });

  it("refuses a glazed finish with neither glaze minutes nor a programme", async () => {
    const zrStandard = (await MaterialMode.findOne({ where: { materialId: t.materialByKey["zirconia"].id, mode: "standard" } }))!;
    const err = await rejection(saveFiringAssignments({ user: admin }, { modes: [{ id: zrStandard.id, heatProgrammeId: "", glazeProgrammeId: "", glazeFiringMinutes: 0 }] }));
    expect(err.status).toBe(422);
    expect((await MaterialMode.findByPk(zrStandard.id))!.glazeFiringMinutes).toBe(15);
  });
});
