// The clinic's settings version against the real PostgreSQL: every write to the scheduling
// settings bumps it in the same transaction, so a copy of the settings kept in an app instance's
// memory is never used after a change; and losers of one booking race share one alternatives answer.
import { beforeAll, describe, expect, it } from "vitest";
import { ClosedDay, Equipment, MaterialMode, OpeningHour, sequelize } from "@/db/models";
import { sharedAlternatives } from "@/lib/booking/alternatives";
import { readClinic } from "@/lib/booking/context";
import { searchSlots } from "@/lib/booking/search";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";

const now = new Date("2027-03-01T12:00:00Z");
let t: TestClinic;
const version = async () => BigInt((await readClinic(t.clinic.id))!.settingsVersion!);

beforeAll(async () => {
  t = await createTestClinic({ chairs: 1, mills: 1, furnaces: 1 });
});

describe("settings version", () => {
  it("moves with every write to hours, closed days, equipment and material modes, and not on a rolled-back one", async () => {
    let before = await version();
    await ClosedDay.create({ clinicId: t.clinic.id, day: "2027-12-24", reason: null });
    expect(await version()).toBeGreaterThan(before);

    before = await version();
    await Equipment.update({ name: "Chair one" }, { where: { clinicId: t.clinic.id, kind: "chair" } });
    expect(await version()).toBeGreaterThan(before);

    before = await version();
    const zr = t.materialByKey["zirconia"];
    await MaterialMode.update({ fabricationMinutes: 31 }, { where: { materialId: zr.id, mode: "rapid" } });
    expect(await version()).toBeGreaterThan(before);

    before = await version();
    await sequelize.transaction(async (transaction) => {
      await OpeningHour.destroy({ where: { clinicId: t.clinic.id, weekday: 6 }, transaction });
      // Seen inside the writing transaction…
      expect(BigInt((await readClinic(t.clinic.id, transaction))!.settingsVersion!)).toBeGreaterThan(before);
      throw new Error("roll back");
    }).catch(() => undefined);
    // …and gone with it.
    expect(await version()).toBe(before);
  });

  it("never answers from settings older than the last change", async () => {
    const { patient } = await createTestPatient(t.clinic.id);
    const proposal = await createTestProposal(t, patient.id, { allow: { zirconia: ["standard"] } });
    const search = () => searchSlots({ proposal, materialId: t.materialByKey["zirconia"].id, mode: "standard", from: "2027-03-10", days: 1, now });
    expect((await search()).slots.length).toBeGreaterThan(0);
    expect((await search()).slots.length).toBeGreaterThan(0);
    // Closing the day must empty it at once, although the settings were just read (and kept).
    await ClosedDay.create({ clinicId: t.clinic.id, day: "2027-03-10", reason: null });
    expect((await search()).slots).toEqual([]);
    await ClosedDay.destroy({ where: { clinicId: t.clinic.id, day: "2027-03-10" } });
    expect((await search()).slots.length).toBeGreaterThan(0);
    // Taking the only chair out of service (a settings write on another table) empties it as well.
    await Equipment.update({ active: false }, { where: { clinicId: t.clinic.id, kind: "chair" } });
    expect((await search()).slots).toEqual([]);
    await Equipment.update({ active: true }, { where: { clinicId: t.clinic.id, kind: "chair" } });
  });
});

describe("shared alternatives", () => {
  it("computes once for concurrent losers of the same race, and separately for another race", async () => {
    let computed = 0;
    const answer = [{ start: "2027-03-10T09:00:00-05:00", end: "2027-03-10T11:00:00-05:00" }];
    const compute = async () => {
      computed++;
      await new Promise((r) => setTimeout(r, 100));
      return answer;
    };
    const key = `test ${t.tag} race-a`;
    const results = await Promise.all(Array.from({ length: 6 }, () => sharedAlternatives(key, compute)));
    expect(computed).toBe(1);
    for (const r of results) expect(r).toEqual(answer);
    await sharedAlternatives(`test ${t.tag} race-b`, compute);
    expect(computed).toBe(2);
  });
});
