// Changing the clinic's reminder timing reschedules the reminders not sent yet, in the same transaction.
import { beforeAll, describe, expect, it } from "vitest";
import { AuditEvent, MailOutbox } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { saveBookingSettings } from "@/lib/data/settings";
import { createTestClinic, type TestClinic } from "../support/fixtures";
import { createVisit } from "../support/mail";

const HOUR = 3_600_000;
let t: TestClinic;
let admin: SessionUser;
const settings = (reminderHoursBefore: string) => ({ slotMinutes: 15, bufferMinutes: 10, minNoticeMinutes: 120, cancelCutoffHours: 24, reminderHoursBefore });
const reminders = async (appointmentId: string) =>
  (await MailOutbox.findAll({ where: { appointmentId, kind: "reminder" }, order: [["createdAt", "ASC"], ["hoursBefore", "DESC"]] }))
    .map((r) => ({ id: r.id, hours: r.hoursBefore, state: r.state, dueAt: r.dueAt.getTime() }));

beforeAll(async () => {
  t = await createTestClinic({ settings: { reminderHoursBefore: [48, 2] } });
  admin = { id: t.staff.admin.id, email: t.staff.admin.email, name: t.staff.admin.name, role: "admin", clinicId: t.clinic.id };
});

describe("reminder timing", () => {
  it("cancels reminders at dropped hours, adds the new hours, keeps unchanged ones, and leaves visits without reminders alone", async () => {
    const ahead = (await createVisit(t, { startsAt: new Date(Date.now() + 96 * HOUR), status: "confirmed" })).visit;
    const soon = (await createVisit(t, { startsAt: new Date(Date.now() + 12 * HOUR), status: "confirmed" })).visit;
    const quiet = (await createVisit(t, { startsAt: new Date(Date.now() + 96 * HOUR), status: "confirmed", remindersEnabled: false })).visit;
    const before = await reminders(ahead.id);
    expect(before.map((r) => [r.hours, r.state])).toEqual([[48, "pending"], [2, "pending"]]);

    await saveBookingSettings({ user: admin }, settings("24, 2"));

    const after = await reminders(ahead.id);
    expect(after.find((r) => r.hours === 48)!.state).toBe("cancelled");
    // The 2-hour reminder is the same row, untouched.
    expect(after.filter((r) => r.hours === 2)).toEqual([before.find((r) => r.hours === 2)]);
    const day = after.find((r) => r.hours === 24)!;
    expect(day.state).toBe("pending");
    expect(day.dueAt).toBe(ahead.startsAt.getTime() - 24 * HOUR);

    // 12 hours ahead: the new 24-hour reminder's time has passed, so it is recorded as skipped, not sent late.
    expect((await reminders(soon.id)).find((r) => r.hours === 24)!.state).toBe("skipped");
    expect(await reminders(quiet.id)).toEqual([]);
    const audit = await AuditEvent.findOne({ where: { clinicId: t.clinic.id, action: "settings.booking" }, order: [["id", "DESC"]] });
    expect(audit!.data).toMatchObject({ reminders: { cancelled: 1, added: 1 } });
  });

  it("does nothing to the outbox when the timing is unchanged", async () => {
    const visit = (await createVisit(t, { startsAt: new Date(Date.now() + 120 * HOUR), status: "confirmed" })).visit;
    const before = await reminders(visit.id);
    await saveBookingSettings({ user: admin }, settings("24, 2"));
    expect(await reminders(visit.id)).toEqual(before);
  });
});
