// Sessions follow the account: turning it off, changing its role, the manager ending its sessions,
// "sign out on all devices" and the absolute lifetime all end an open session on its next use.
import type { JWT } from "next-auth/jwt";
import { describe, expect, it } from "vitest";
import { AuditEvent, User } from "@/db/models";
import { signOutEverywhere } from "@/lib/auth/account";
import { authOptionsFor } from "@/lib/auth/options";
import { changeStaffAccess, endStaffSessions } from "@/lib/data/staff";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, createTestPatient } from "../support/fixtures";
import { sessionOf } from "../support/session";

const jwt = authOptionsFor().callbacks!.jwt!;
const asUser = sessionOf;

/** A token as sign-in makes it, then one later use of it (what every request does). */
async function signIn(u: User, authAtOffsetSeconds = 0): Promise<JWT> {
  const token = await jwt({ token: { sub: u.id, email: u.email }, user: { id: u.id, email: u.email }, account: null } as never);
  return { ...token, authAt: (token.authAt as number) + authAtOffsetSeconds };
}
const use = (token: JWT) => jwt({ token } as never);
const statusOf = (p: Promise<unknown>) => p.then(() => 200, (e: unknown) => (e instanceof AppError ? e.status : 500));

describe("sessions follow the account", () => {
  it("turning a staff account off ends its session at once; the change and its audit share a transaction", async () => {
    const t = await createTestClinic();
    const token = await signIn(t.staff.dentist);
    await expect(use(token)).resolves.toMatchObject({ role: "dentist" });
    await changeStaffAccess({ user: asUser(t.staff.admin), ip: "192.0.2.1" }, t.staff.dentist.id, { active: false });
    await expect(use(token)).rejects.toThrow(/session ended/);
    const audit = await AuditEvent.findOne({ where: { subjectId: t.staff.dentist.id, action: "settings.staff_changed" } });
    expect(audit?.data).toMatchObject({ before: { active: true }, after: { active: false }, sessionsEnded: true });
    // Turned back on, the old session stays ended: they sign in again.
    await changeStaffAccess({ user: asUser(t.staff.admin) }, t.staff.dentist.id, { active: true });
    await expect(use(token)).rejects.toThrow(/session ended/);
    await expect(use(await signIn((await User.findByPk(t.staff.dentist.id))!))).resolves.toMatchObject({ role: "dentist" });
  });

  it("a role change ends the session, even when made directly in the database (the row is what counts)", async () => {
    const t = await createTestClinic();
    const token = await signIn(t.staff.reception);
    await changeStaffAccess({ user: asUser(t.staff.admin) }, t.staff.reception.id, { role: "dentist" });
    await expect(use(token)).rejects.toThrow(/session ended/);

    const other = await signIn(t.staff.dentist);
    await User.update({ role: "admin" }, { where: { id: t.staff.dentist.id } });
    await expect(use(other)).rejects.toThrow(/session ended/);
  });

  it("a patient turned off elsewhere (archived) loses the session too", async () => {
    const t = await createTestClinic();
    const { user } = await createTestPatient(t.clinic.id);
    const token = await signIn(user);
    await expect(use(token)).resolves.toMatchObject({ role: "patient" });
    await User.update({ active: false }, { where: { id: user.id } });
    await expect(use(token)).rejects.toThrow(/session ended/);
  });

  it("sign out on all devices, and the manager ending a staff member's sessions", async () => {
    const t = await createTestClinic();
    const phone = await signIn(t.staff.reception);
    const desk = await signIn(t.staff.reception);
    await signOutEverywhere(asUser(t.staff.reception), { ip: "192.0.2.2" });
    await expect(use(phone)).rejects.toThrow(/session ended/);
    await expect(use(desk)).rejects.toThrow(/session ended/);
    expect(await AuditEvent.count({ where: { subjectId: t.staff.reception.id, action: "auth.signed_out_everywhere" } })).toBe(1);

    const again = await signIn((await User.findByPk(t.staff.reception.id))!);
    await endStaffSessions({ user: asUser(t.staff.admin) }, t.staff.reception.id);
    await expect(use(again)).rejects.toThrow(/session ended/);
    expect(await statusOf(endStaffSessions({ user: asUser(t.staff.dentist) }, t.staff.reception.id))).toBe(403);
  });

  it("absolute lifetime from sign-in: 12 hours for staff, 30 days for patients", async () => {
    const t = await createTestClinic();
    await expect(use(await signIn(t.staff.dentist, -(11 * 3600)))).resolves.toBeTruthy();
    await expect(use(await signIn(t.staff.dentist, -(12 * 3600 + 5)))).rejects.toThrow(/lifetime/);
    const { user } = await createTestPatient(t.clinic.id);
    await expect(use(await signIn(user, -(29 * 86400)))).resolves.toBeTruthy();
    await expect(use(await signIn(user, -(30 * 86400 + 5)))).rejects.toThrow(/lifetime/);
  });

  it("a token from before session versions (no version) is refused", async () => {
    const t = await createTestClinic();
    const token = await signIn(t.staff.dentist);
    delete token.sv;
    await expect(use(token)).rejects.toThrow(/session ended/);
  });
});

describe("changing staff access (PATCH /api/staff/:id and the settings page)", () => {
  it("clinic manager only; another clinic's staff is not found; bad input changes nothing", async () => {
    const t = await createTestClinic();
    const other = await createTestClinic();
    expect(await statusOf(changeStaffAccess({ user: asUser(t.staff.dentist) }, t.staff.reception.id, { active: false }))).toBe(403);
    expect(await statusOf(changeStaffAccess({ user: asUser(t.staff.reception) }, t.staff.dentist.id, { active: false }))).toBe(403);
    expect(await statusOf(changeStaffAccess({ user: asUser(t.staff.admin) }, other.staff.reception.id, { active: false }))).toBe(404);
    expect(await statusOf(changeStaffAccess({ user: asUser(t.staff.admin) }, "not-a-uuid", { active: false }))).toBe(404);
    const { user: patient } = await createTestPatient(t.clinic.id);
    expect(await statusOf(changeStaffAccess({ user: asUser(t.staff.admin) }, patient.id, { active: false }))).toBe(404);
    await expect(changeStaffAccess({ user: asUser(t.staff.admin) }, t.staff.reception.id, {})).rejects.toThrow(/Send active, role/);
    await expect(changeStaffAccess({ user: asUser(t.staff.admin) }, t.staff.reception.id, { role: "patient" })).rejects.toThrow();
    await expect(changeStaffAccess({ user: asUser(t.staff.admin) }, t.staff.reception.id, { active: false, name: "x" })).rejects.toThrow();
    expect((await User.findByPk(other.staff.reception.id))!.active).toBe(true);
    expect((await User.findByPk(t.staff.reception.id))!).toMatchObject({ active: true, role: "reception" });
    expect(await AuditEvent.count({ where: { clinicId: t.clinic.id, action: "settings.staff_changed" } })).toBe(0);
  });

  it("the last active clinic manager cannot turn themself off or step down (409), and nothing is written", async () => {
    const t = await createTestClinic();
    const admin = asUser(t.staff.admin);
    const token = await signIn(t.staff.admin);
    expect(await statusOf(changeStaffAccess({ user: admin }, admin.id, { active: false }))).toBe(409);
    expect(await statusOf(changeStaffAccess({ user: admin }, admin.id, { role: "dentist" }))).toBe(409);
    await expect(use(token)).resolves.toBeTruthy();
    expect(await AuditEvent.count({ where: { clinicId: t.clinic.id, action: "settings.staff_changed" } })).toBe(0);
    // With a second manager, stepping down works (and ends the old session, whose role changed).
    await changeStaffAccess({ user: admin }, t.staff.dentist.id, { role: "admin" });
    await expect(changeStaffAccess({ user: admin }, admin.id, { role: "dentist" })).resolves.toMatchObject({ role: "dentist", active: true });
    await expect(use(token)).rejects.toThrow(/session ended/);
  });

  it("a request that changes nothing keeps sessions open", async () => {
    const t = await createTestClinic();
    const token = await signIn(t.staff.reception);
    await changeStaffAccess({ user: asUser(t.staff.admin) }, t.staff.reception.id, { active: true, role: "reception" });
    await expect(use(token)).resolves.toBeTruthy();
  });
});
