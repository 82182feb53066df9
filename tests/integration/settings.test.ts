// The clinic manager's settings against the real PostgreSQL: admin only, validated, audited.
import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { ZodError } from "zod";
import { AuditEvent, Clinic, ClosedDay, Equipment, MaterialMode, OpeningHour, StageDuration, User } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { verifyPassword } from "@/lib/auth/password";
import {
  addClosedDay, createStaffAccount, getDurations, saveBookingSettings, saveEquipment, saveMaterialModes, saveOpeningHours,
  saveStageDurations, updateStaffAccount,
} from "@/lib/data/settings";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, type TestClinic } from "../support/fixtures";
import { sessionOf as asUser } from "../support/session";

let t: TestClinic;
let admin: { user: SessionUser };

async function failure(p: Promise<unknown>) {
  return p.then(() => null, (e) => e as unknown);
}

beforeAll(async () => {
  t = await createTestClinic();
  admin = { user: asUser(t.staff.admin) };
});

describe("settings", () => {
  it("refuses everyone but the clinic manager", async () => {
    for (const role of ["reception", "dentist"] as const) {
      const err = await failure(saveBookingSettings({ user: asUser(t.staff[role]) }, { slotMinutes: 15, bufferMinutes: 10, minNoticeMinutes: 60, cancelCutoffHours: 24, reminderHoursBefore: "24" }));
      expect(err).toBeInstanceOf(AppError);
      expect((err as AppError).status).toBe(403);
    }
  });

  it("replaces opening hours, refusing overlaps and closing before opening, and audits before and after", async () => {
    const overlap = await failure(saveOpeningHours(admin, { hours: [{ weekday: 1, opens: "08:00", closes: "12:00" }, { weekday: 1, opens: "11:00", closes: "15:00" }] }));
    expect(overlap).toBeInstanceOf(ZodError);
    expect((overlap as ZodError).issues[0]).toMatchObject({ path: ["hours", 1, "opens"], message: "This overlaps another Monday interval." });
    const backwards = await failure(saveOpeningHours(admin, { hours: [{ weekday: 2, opens: "12:00", closes: "08:00" }] }));
    expect((backwards as ZodError).issues[0].message).toBe("Closing must come after opening.");
    expect(await OpeningHour.count({ where: { clinicId: t.clinic.id } })).toBe(11);

    await saveOpeningHours(admin, { hours: [{ weekday: 1, opens: "07:30", closes: "12:00" }, { weekday: 1, opens: "13:00", closes: "16:00" }, { weekday: 3, opens: "09:00", closes: "17:00" }] });
    const rows = await OpeningHour.findAll({ where: { clinicId: t.clinic.id }, order: [["weekday", "ASC"], ["opens", "ASC"]] });
    expect(rows.map((r) => [r.weekday, r.opens.slice(0, 5), r.closes.slice(0, 5)])).toEqual([[1, "07:30", "12:00"], [1, "13:00", "16:00"], [3, "09:00", "17:00"]]);
    const audit = await AuditEvent.findOne({ where: { clinicId: t.clinic.id, action: "settings.opening_hours" } });
    expect((audit!.data.before as unknown[]).length).toBe(11);
    expect(audit!.actorUserId).toBe(t.staff.admin.id);
  });

  it("adds closed days once", async () => {
    await addClosedDay(admin, { day: "2027-01-01", reason: "New year" });
    expect(await ClosedDay.count({ where: { clinicId: t.clinic.id, day: "2027-01-01" } })).toBe(1);
    const again = await failure(addClosedDay(admin, { day: "2027-01-01" }));
    expect((again as AppError).status).toBe(409);
  });

  it("adds and renames equipment, refusing duplicate names and a change of kind", async () => {
    const id = await saveEquipment(admin, { kind: "mill", name: "Mill Z", active: true });
    await saveEquipment(admin, { id, kind: "mill", name: "Mill Zeta", active: false });
    expect(await Equipment.findByPk(id)).toMatchObject({ name: "Mill Zeta", active: false });
    expect(((await failure(saveEquipment(admin, { kind: "chair", name: "Mill Zeta", active: true }))) as AppError).status).toBe(409);
    expect(((await failure(saveEquipment(admin, { id, kind: "furnace", name: "Mill Zeta", active: true }))) as AppError).status).toBe(422);
    const other = await createTestClinic();
    const foreign = other.equipment[0];
    expect(((await failure(saveEquipment(admin, { id: foreign.id, kind: foreign.kind, name: "Taken", active: true }))) as AppError).status).toBe(404);
  });

  it("saves stage durations only with a row for all teeth per stage", async () => {
    const { stages } = await getDurations({ clinicId: t.clinic.id });
    const missing = await failure(saveStageDurations(admin, { rows: stages.filter((s) => s.stage !== "scan") }));
    expect((missing as ZodError).issues[0].message).toMatch(/scan/);
    const rows = stages.map((s) => (s.stage === "design" ? { ...s, minutes: 20 } : s));
    await saveStageDurations(admin, { rows: [...rows, { stage: "design", toothClass: "anterior", minutes: 25 }] });
    const design = await StageDuration.findAll({ where: { clinicId: t.clinic.id, stage: "design" }, order: [["toothClass", "ASC"]] });
    expect(design.map((d) => [d.toothClass, d.minutes])).toEqual([["anterior", 25], [null, 20]]);
    const dup = await failure(saveStageDurations(admin, { rows: [...rows, { stage: "scan", toothClass: "", minutes: 5 }] }));
    expect((dup as ZodError).issues[0].message).toMatch(/already has a row/);
  });

  it("saves material minutes, keeping heat treatment above zero where the material is fired", async () => {
    const { materials } = await getDurations({ clinicId: t.clinic.id });
    const zr = materials.find((m) => m.name === "Zirconia")!.modes.find((m) => m.mode === "rapid")!;
    const bad = await failure(saveMaterialModes(admin, { modes: [{ id: zr.id, fabricationMinutes: 6, heatTreatmentMinutes: 0, finishingMinutes: 10 }] }));
    expect((bad as AppError).status).toBe(422);
    await saveMaterialModes(admin, { modes: [{ id: zr.id, fabricationMinutes: 6, heatTreatmentMinutes: 22, finishingMinutes: 10 }] });
    expect(await MaterialMode.findByPk(zr.id)).toMatchObject({ fabricationMinutes: 6, heatTreatmentMinutes: 22 });
    const other = await createTestClinic();
    const foreign = other.materials[0].modes![0];
    expect(((await failure(saveMaterialModes(admin, { modes: [{ id: Number(foreign.id), fabricationMinutes: 6, heatTreatmentMinutes: 22, finishingMinutes: 10 }] }))) as AppError).status).toBe(404);
    const audit = await AuditEvent.findOne({ where: { clinicId: t.clinic.id, action: "settings.material_minutes" } });
    expect(audit!.data).toMatchObject({ changes: [{ material: "zirconia", mode: "rapid", after: { fabricationMinutes: 6, heatTreatmentMinutes: 22 } }] });
  });

  it("reads reminder hours from a typed list and refuses nonsense", async () => {
    await saveBookingSettings(admin, { slotMinutes: 30, bufferMinutes: 5, minNoticeMinutes: 240, cancelCutoffHours: 48, reminderHoursBefore: "2, 72,24" });
    expect((await Clinic.findByPk(t.clinic.id))!.settings).toMatchObject({ slotMinutes: 30, reminderHoursBefore: [72, 24, 2] });
    const bad = await failure(saveBookingSettings(admin, { slotMinutes: 7, bufferMinutes: 5, minNoticeMinutes: 240, cancelCutoffHours: 48, reminderHoursBefore: "48" }));
    expect((bad as ZodError).issues[0].path).toEqual(["slotMinutes"]);
    const words = await failure(saveBookingSettings(admin, { slotMinutes: 15, bufferMinutes: 5, minNoticeMinutes: 240, cancelCutoffHours: 48, reminderHoursBefore: "two days" }));
    expect((words as ZodError).issues[0].message).toMatch(/separated by commas/);
  });

  it("creates staff accounts and keeps at least one active clinic manager", async () => {
    const email = `New.Person-${randomUUID().slice(0, 6)}@Cuspal.test`;
    const id = await createStaffAccount(admin, { name: "New Person", email, role: "dentist", password: "a long first password" });
    const created = (await User.findByPk(id))!;
    expect(created).toMatchObject({ email: email.toLowerCase(), role: "dentist", clinicId: t.clinic.id });
    expect(await verifyPassword("a long first password", created.passwordHash!)).toBe(true);
    expect(((await failure(createStaffAccount(admin, { name: "Again", email, role: "reception", password: "a long first password" }))) as AppError).status).toBe(409);
    expect((await failure(createStaffAccount(admin, { name: "Short", email: "short@cuspal.test", role: "reception", password: "short" }))) ).toBeInstanceOf(ZodError);

    const lastAdmin = await failure(updateStaffAccount(admin, { id: t.staff.admin.id, role: "dentist", active: true }));
    expect((lastAdmin as AppError).status).toBe(409);
    await updateStaffAccount(admin, { id, role: "admin", active: true });
    await updateStaffAccount(admin, { id: t.staff.admin.id, role: "reception", active: true });
    expect((await User.findByPk(t.staff.admin.id))!.role).toBe("reception");
    expect(await AuditEvent.count({ where: { clinicId: t.clinic.id, action: "settings.staff_changed" } })).toBe(2);
  });
});
