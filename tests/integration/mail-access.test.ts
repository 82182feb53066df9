// Who may see a visit's delivery log and change its reminders: patients their own visits only
// (someone else's is a 404), staff their own clinic's; the signed link works without a session.
import { describe, expect, it, beforeAll } from "vitest";
import { AuditEvent, MailOutbox, sequelize } from "@/db/models";
import { getDeliveryLog, setRemindersByToken, setVisitReminders, visitForReminderToken } from "@/lib/data/mail";
import { reminderToken } from "@/lib/mail/reminder-token";
import { AppError } from "@/lib/server/errors";
import { createTestClinic, type TestClinic } from "../support/fixtures";
import { createVisit } from "../support/mail";
import { sessionOf as asUser } from "../support/session";

let t: TestClinic;
let other: TestClinic;

async function status(p: Promise<unknown>): Promise<number> {
  const err = await p.then(() => null, (e) => e);
  expect(err).toBeInstanceOf(AppError);
  return (err as AppError).status;
}

const inDays = (d: number) => new Date(Math.floor((Date.now() + d * 86_400_000) / 3_600_000) * 3_600_000);

beforeAll(async () => {
  [t, other] = await Promise.all([createTestClinic(), createTestClinic()]);
});

describe("reminder switch", () => {
  it("lets the patient turn their own visit's reminders off and on, withdrawing and rescheduling them, with an audit event", async () => {
    const { visit, user } = await createVisit(t, { startsAt: inDays(5), status: "confirmed" });
    const me = asUser(user);
    expect(await setVisitReminders({ user: me, appointmentId: visit.id, enabled: false })).toEqual({ remindersEnabled: false });
    expect(await MailOutbox.count({ where: { appointmentId: visit.id, kind: "reminder", state: "pending" } })).toBe(0);
    expect(await AuditEvent.count({ where: { subjectId: visit.id, action: "visit.reminders_off" } })).toBe(1);
    expect(await setVisitReminders({ user: me, appointmentId: visit.id, enabled: true })).toEqual({ remindersEnabled: true });
    expect(await MailOutbox.count({ where: { appointmentId: visit.id, kind: "reminder", state: "pending" } })).toBe(2);
  });

  it("gives another patient a 404 and staff a 403, changing nothing", async () => {
    const { visit } = await createVisit(t, { startsAt: inDays(5), status: "confirmed" });
    const { user: stranger } = await createVisit(t, { startsAt: inDays(6) });
    expect(await status(setVisitReminders({ user: asUser(stranger), appointmentId: visit.id, enabled: false }))).toBe(404);
    expect(await status(setVisitReminders({ user: asUser(t.staff.reception), appointmentId: visit.id, enabled: false }))).toBe(403);
    expect(await status(setVisitReminders({ user: asUser(stranger), appointmentId: "not-a-uuid", enabled: false }))).toBe(404);
    await visit.reload();
    expect(visit.remindersEnabled).toBe(true);
  });

  it("works from the signed e-mail link, and a forged link is a 404", async () => {
    const { visit } = await createVisit(t, { startsAt: inDays(5), status: "confirmed" });
    const token = reminderToken(visit.id, visit.startsAt);
    expect((await visitForReminderToken(token))?.visit.id).toBe(visit.id);
    expect(await setRemindersByToken({ token, enabled: false })).toEqual({ remindersEnabled: false });
    const audit = await AuditEvent.findOne({ where: { subjectId: visit.id, action: "visit.reminders_off" } });
    expect(audit?.actorUserId).toBeNull();
    expect(audit?.data).toEqual({ via: "e-mail link" });
    const forged = `${token.split(".").slice(0, 2).join(".")}.${"A".repeat(43)}`;
    expect(await visitForReminderToken(forged)).toBeNull();
    expect(await status(setRemindersByToken({ token: forged, enabled: true }))).toBe(404);
    await visit.reload();
    expect(visit.remindersEnabled).toBe(false);
  });

  it("stops working once the visit moved (the newer e-mail's link replaces it)", async () => {
    const { visit } = await createVisit(t, { startsAt: inDays(5), status: "confirmed" });
    const old = reminderToken(visit.id, visit.startsAt);
    await visit.update({ startsAt: inDays(6), endsAt: new Date(inDays(6).getTime() + 150 * 60_000) });
    expect(await visitForReminderToken(old)).toBeNull();
    expect(await status(setRemindersByToken({ token: old, enabled: false }))).toBe(404);
    await visit.reload();
    expect(visit.remindersEnabled).toBe(true);
    const fresh = reminderToken(visit.id, visit.startsAt);
    expect((await visitForReminderToken(fresh))?.visit.id).toBe(visit.id);
  });

  it("stops working 30 days after the visit", async () => {
    const { visit } = await createVisit(t, { startsAt: inDays(5), status: "confirmed" });
    const past = new Date(Date.now() - 31 * 24 * 3600 * 1000);
    await visit.update({ status: "cancelled" });
    await sequelize.query("UPDATE appointments SET starts_at = $2, ends_at = $3 WHERE id = $1", {
      bind: [visit.id, past, new Date(past.getTime() + 150 * 60_000)],
    });
    const expired = reminderToken(visit.id, past);
    expect(await visitForReminderToken(expired)).toBeNull();
    expect(await status(setRemindersByToken({ token: expired, enabled: false }))).toBe(404);
  });

  it("cannot turn reminders on for a visit that has ended", async () => {
    const { visit } = await createVisit(t, { startsAt: inDays(5), status: "confirmed", remindersEnabled: false });
    await visit.update({ status: "cancelled" });
    expect(await status(setRemindersByToken({ token: reminderToken(visit.id, visit.startsAt), enabled: true }))).toBe(409);
  });
});

describe("delivery log", () => {
  it("shows staff of the clinic each message with its status; other clinics and patients get nothing", async () => {
    const { visit, user } = await createVisit(t, { startsAt: inDays(4) });
    await visit.update({ status: "confirmed" });
    const log = await getDeliveryLog({ user: asUser(t.staff.reception), appointmentId: visit.id });
    expect(log.remindersEnabled).toBe(true);
    expect(log.timeZone).toBe("America/Toronto");
    expect(log.entries.map((e) => [e.label, e.status]).sort()).toEqual([
      ["Confirmation with calendar file", "sending"],
      ["Reminder, 2 h before", "scheduled"],
      ["Reminder, 48 h before", "scheduled"],
      ["Request received", "sending"],
    ]);
    expect(await status(getDeliveryLog({ user: asUser(other.staff.reception), appointmentId: visit.id }))).toBe(404);
    expect(await status(getDeliveryLog({ user: asUser(user), appointmentId: visit.id }))).toBe(403);
  });
});
