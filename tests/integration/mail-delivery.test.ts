// E-mail that never gets lost, against the real PostgreSQL, pg-boss and a real mail catcher:
// visit changes write the outbox in their own transaction, the worker's drain delivers each
// message once, reminders fire at their time, and a dead mail server only delays delivery.
import ICAL from "ical.js";
import nodemailer from "nodemailer";
import { PDFDocument } from "pdf-lib";
import { QueryTypes } from "sequelize";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Appointment, MailAttempt, MailOutbox, sequelize } from "@/db/models";
import { drainMailOnce, stopBoss } from "@/lib/jobs/mail-queue";
import { sendConsentCopy } from "@/lib/mail/consent-copy";
import { deliverOutboxMessage } from "@/lib/mail/deliver";
import { createTestClinic, type TestClinic } from "../support/fixtures";
import { caughtAttachment, caughtFor, caughtSource, catcherUrl, changeVisit, createVisit, eventually, freePort, LocalCatcher } from "../support/mail";

const HOUR = 3_600_000;
let t: TestClinic;

/** A start time on a whole hour, `hours` from now. */
function hoursFromNow(hours: number): Date {
  const d = new Date(Date.now() + hours * HOUR);
  d.setUTCMinutes(0, 0, 0);
  return d;
}

async function outbox(appointmentId: string) {
  return MailOutbox.findAll({ where: { appointmentId }, order: [["createdAt", "ASC"], ["dueAt", "ASC"]] });
}

function parseIcs(text: string) {
  const vcalendar = new ICAL.Component(ICAL.parse(text));
  const vevent = vcalendar.getFirstSubcomponent("vevent")!;
  return { vcalendar, vevent, event: new ICAL.Event(vevent) };
}

beforeAll(async () => {
  t = await createTestClinic({ timeZone: "America/Toronto", settings: { reminderHoursBefore: [48, 2] } });
});

afterAll(async () => {
  await stopBoss();
});

describe("visit hooks write the outbox in the visit's transaction", () => {
  it("writes nothing when the visit change rolls back, and the request e-mail when it commits", async () => {
    const { visit } = await createVisit(t, { startsAt: hoursFromNow(72) });
    expect((await outbox(visit.id)).map((r) => r.kind)).toEqual(["visit_requested"]);

    // A confirmation whose transaction fails leaves neither the status nor any e-mail behind.
    await expect(
      sequelize.transaction(async (transaction) => {
        const v = await Appointment.findByPk(visit.id, { transaction, rejectOnEmpty: true });
        await v.update({ status: "confirmed" }, { transaction });
        expect((await MailOutbox.count({ where: { appointmentId: visit.id }, transaction }))).toBe(4);
        throw new Error("crash before commit");
      }),
    ).rejects.toThrow("crash before commit");
    expect((await Appointment.findByPk(visit.id))!.status).toBe("requested");
    expect((await outbox(visit.id)).map((r) => r.kind)).toEqual(["visit_requested"]);
  });

  it("on confirmation queues the confirmation and one reminder per clinic setting; a reminder already past is skipped", async () => {
    const { visit } = await createVisit(t, { startsAt: hoursFromNow(10) });
    await changeVisit(visit.id, { status: "confirmed" });
    const rows = await outbox(visit.id);
    const reminders = rows.filter((r) => r.kind === "reminder");
    expect(rows.filter((r) => r.kind === "visit_confirmed")).toHaveLength(1);
    expect(reminders.map((r) => [r.hoursBefore, r.state])).toEqual([[48, "skipped"], [2, "pending"]]);
    const twoHours = reminders.find((r) => r.hoursBefore === 2)!;
    expect(twoHours.dueAt.getTime()).toBe(visit.startsAt.getTime() - 2 * HOUR);
    expect(twoHours.idempotencyKey).toBe(`${visit.id}/reminder-2h/${visit.startsAt.toISOString()}`);
  });

  it("a visit created already confirmed (as the demo seed does) gets its confirmation and reminders", async () => {
    const { visit } = await createVisit(t, { startsAt: hoursFromNow(96), status: "confirmed" });
    const rows = await outbox(visit.id);
    expect(rows.map((r) => [r.kind, r.hoursBefore, r.state])).toEqual([
      ["visit_confirmed", null, "pending"],
      ["reminder", 48, "pending"],
      ["reminder", 2, "pending"],
    ]);
  });

  it("moving a visit replaces its reminders; cancelling withdraws them; turning reminders off and on follows", async () => {
    const { visit } = await createVisit(t, { startsAt: hoursFromNow(96), status: "confirmed" });
    const later = new Date(visit.startsAt.getTime() + 24 * HOUR);
    await changeVisit(visit.id, { startsAt: later, endsAt: new Date(later.getTime() + 150 * 60_000) });
    let rows = await outbox(visit.id);
    expect(rows.filter((r) => r.kind === "visit_moved")).toHaveLength(1);
    expect(rows.filter((r) => r.kind === "reminder" && r.state === "cancelled").map((r) => r.visitStartsAt.getTime())).toEqual([visit.startsAt.getTime(), visit.startsAt.getTime()]);
    expect(rows.filter((r) => r.kind === "reminder" && r.state === "pending").map((r) => r.dueAt.getTime())).toEqual([later.getTime() - 48 * HOUR, later.getTime() - 2 * HOUR]);

    await changeVisit(visit.id, { remindersEnabled: false });
    rows = await outbox(visit.id);
    expect(rows.filter((r) => r.kind === "reminder" && r.state === "pending")).toHaveLength(0);
    await changeVisit(visit.id, { remindersEnabled: true });
    rows = await outbox(visit.id);
    expect(rows.filter((r) => r.kind === "reminder" && r.state === "pending")).toHaveLength(2);

    await changeVisit(visit.id, { status: "cancelled", statusReason: "The patient asked to cancel." });
    rows = await outbox(visit.id);
    expect(rows.filter((r) => r.kind === "reminder" && r.state === "pending")).toHaveLength(0);
    expect(rows.filter((r) => r.kind === "visit_cancelled")).toHaveLength(1);
  });
});

describe.skipIf(!catcherUrl)("delivery through the mail catcher", () => {
  it("confirming a visit sends exactly one confirmation with a calendar file for the visit's instant", async () => {
    const { visit, user } = await createVisit(t, { startsAt: hoursFromNow(80) });
    await drainMailOnce({ clinicId: t.clinic.id });
    await changeVisit(visit.id, { status: "confirmed" });
    await drainMailOnce({ clinicId: t.clinic.id });
    await drainMailOnce({ clinicId: t.clinic.id });

    const mails = await eventually(async () => {
      const all = await caughtFor(user.email);
      return all.length >= 2 ? all : null;
    });
    const confirmations = mails.filter((m) => m.subject.startsWith("Confirmed:"));
    expect(confirmations).toHaveLength(1);
    expect(mails.filter((m) => m.subject.startsWith("We have your crown visit request"))).toHaveLength(1);
    const [mail] = confirmations;
    expect(mail.attachments?.map((a) => a.contentType)).toEqual(["text/calendar"]);
    // The e-mail names the clinic's zone and shows the clinic-local time (Intl is the reference).
    const local = new Intl.DateTimeFormat("en-GB", { timeZone: "America/Toronto", hour: "2-digit", minute: "2-digit", hourCycle: "h23" }).format(visit.startsAt);
    expect(mail.text).toContain(local);
    expect(mail.text).toMatch(/Eastern (Standard|Daylight) Time/);
    expect(mail.text).toContain(`/patient/visits/${visit.id}`);

    // Parsed with a general-purpose iCalendar library (ical.js); RFC 5545 §3.6.1 [P]: UID and
    // DTSTAMP required, DTEND and DURATION never both.
    const ics = await caughtAttachment(mail, mail.attachments![0].generatedFileName);
    const { vcalendar, vevent, event } = parseIcs(ics);
    expect(vcalendar.getFirstPropertyValue("method")).toBe("PUBLISH");
    expect(event.uid).toBe(`visit-${visit.id}@cuspal`);
    expect(vevent.hasProperty("dtstamp")).toBe(true);
    expect(event.startDate.toJSDate().getTime()).toBe(visit.startsAt.getTime());
    expect(event.endDate.toJSDate().getTime()).toBe(visit.endsAt.getTime());
    expect(vevent.hasProperty("dtend") && vevent.hasProperty("duration")).toBe(false);
    expect(vevent.getFirstSubcomponent("valarm")?.getFirstPropertyValue("action")).toBe("DISPLAY");

    const attempts = await MailAttempt.findAll({ where: { appointmentId: visit.id } });
    expect(attempts.map((a) => a.outcome)).toEqual(["sent", "sent"]);
  });

  it("fires each reminder when its time comes, exactly once, and never twice for the same key", async () => {
    const own = await createTestClinic({ timeZone: "America/Toronto" });
    const { visit, user } = await createVisit(own, { startsAt: hoursFromNow(60), status: "confirmed" });
    await drainMailOnce({ clinicId: own.clinic.id });
    const rows0 = await outbox(visit.id);
    const due48 = rows0.find((r) => r.hoursBefore === 48)!.dueAt.getTime();
    const due2 = rows0.find((r) => r.hoursBefore === 2)!.dueAt.getTime();
    const reminders = async () => (await caughtFor(user.email)).filter((m) => m.subject.startsWith("Reminder:"));

    // Not yet due: nothing but the confirmation goes out.
    await drainMailOnce({ clinicId: own.clinic.id, now: new Date(due48 - 60_000) });
    await eventually(async () => (await caughtFor(user.email)).length === 1);
    expect(await reminders()).toHaveLength(0);

    // The clock passes the 48-hour mark: one reminder, however often the worker passes by.
    const at48 = new Date(due48 + 60_000);
    await drainMailOnce({ clinicId: own.clinic.id, now: at48 });
    await drainMailOnce({ clinicId: own.clinic.id, now: at48 });
    const [first] = await eventually(async () => ((await reminders()).length ? reminders() : null));
    await new Promise((r) => setTimeout(r, 300));
    expect(await reminders()).toHaveLength(1);
    expect(first.attachments?.map((a) => a.filename)).toEqual(["crown-visit.ics"]);
    // One-click opt-out for mail programs (RFC 8058 [P]): a POST to the link in List-Unsubscribe.
    expect(await caughtSource(first)).toMatch(/^List-Unsubscribe-Post: List-Unsubscribe=One-Click\r?$/m);
    expect(first.text).toMatch(/list of the medicines/);
    expect(first.subject).toMatch(/^Reminder: your crown visit on /);
    expect(first.text).toMatch(/in 2 days/i);

    // And past the 2-hour mark: the second reminder, once.
    const at2 = new Date(due2 + 60_000);
    await drainMailOnce({ clinicId: own.clinic.id, now: at2 });
    await drainMailOnce({ clinicId: own.clinic.id, now: at2 });
    await eventually(async () => (await reminders()).length === 2);
    await new Promise((r) => setTimeout(r, 300));
    expect(await reminders()).toHaveLength(2);
    const rows = await outbox(visit.id);
    expect(rows.filter((r) => r.kind === "reminder").map((r) => [r.hoursBefore, r.state])).toEqual([[48, "sent"], [2, "sent"]]);

    // A second outbox row with the same key (a duplicated job) is not sent again.
    const twoHours = rows.find((r) => r.hoursBefore === 2)!;
    const copy = await MailOutbox.create({
      clinicId: own.clinic.id, appointmentId: visit.id, kind: "reminder", hoursBefore: 2, visitStartsAt: visit.startsAt,
      idempotencyKey: twoHours.idempotencyKey, dueAt: twoHours.dueAt, state: "queued",
    });
    expect(await deliverOutboxMessage(copy.id, { attempt: 1, finalAttempt: false, now: at2 })).toBe("duplicate");
    expect(await reminders()).toHaveLength(2);
  });

  it("after the worker was down, only the latest due reminder goes out", async () => {
    const own = await createTestClinic({ timeZone: "America/Toronto" });
    const { visit, user } = await createVisit(own, { startsAt: hoursFromNow(60), status: "confirmed" });
    const due2 = (await outbox(visit.id)).find((r) => r.hoursBefore === 2)!.dueAt.getTime();
    await drainMailOnce({ clinicId: own.clinic.id, now: new Date(due2 + 60_000) });
    const rows = await outbox(visit.id);
    expect(rows.filter((r) => r.kind === "reminder").map((r) => [r.hoursBefore, r.state])).toEqual([[48, "skipped"], [2, "sent"]]);
    await eventually(async () => (await caughtFor(user.email)).length === 2);
    expect((await caughtFor(user.email)).filter((m) => m.subject.startsWith("Reminder:"))).toHaveLength(1);
  });

  it("a moved visit gets a new-time e-mail with an updated calendar copy; a cancelled one a cancelling copy", async () => {
    const own = await createTestClinic({ timeZone: "America/Toronto" });
    const { visit, user } = await createVisit(own, { startsAt: hoursFromNow(100), status: "confirmed" });
    await drainMailOnce({ clinicId: own.clinic.id });
    const later = new Date(visit.startsAt.getTime() + 26 * HOUR);
    await changeVisit(visit.id, { startsAt: later, endsAt: new Date(later.getTime() + 150 * 60_000) });
    await drainMailOnce({ clinicId: own.clinic.id });
    await changeVisit(visit.id, { status: "cancelled", statusReason: "Asked by the patient." });
    await drainMailOnce({ clinicId: own.clinic.id });

    const mails = await eventually(async () => {
      const m = await caughtFor(user.email);
      return m.length >= 3 ? m : null;
    });
    const calendar = async (prefix: string) => {
      const m = mails.find((x) => x.subject.startsWith(prefix))!;
      return parseIcs(await caughtAttachment(m, m.attachments![0].generatedFileName));
    };
    const confirmed = await calendar("Confirmed:");
    const moved = await calendar("New time:");
    const cancelled = await calendar("Cancelled:");
    // One UID for the visit throughout; SEQUENCE rises with each revision (RFC 5545 §3.8.7.4 [P]).
    expect(new Set([confirmed.event.uid, moved.event.uid, cancelled.event.uid]).size).toBe(1);
    expect([confirmed.event.sequence, moved.event.sequence, cancelled.event.sequence]).toEqual([0, 1, 2]);
    expect(moved.event.startDate.toJSDate().getTime()).toBe(later.getTime());
    expect(cancelled.vevent.getFirstPropertyValue("status")).toBe("CANCELLED");
    const movedMail = mails.find((x) => x.subject.startsWith("New time:"))!;
    expect(movedMail.text).toMatch(/It was on .+ at \d\d:\d\d \(Eastern (Standard|Daylight) Time\)/);
    expect(mails.find((x) => x.subject.startsWith("Cancelled:"))!.text).toContain("Reason given: Asked by the patient.");
    expect(mails.filter((x) => x.subject.startsWith("Reminder:"))).toHaveLength(0);
  });

  it("sends the consent copy with its PDF attached, once per PDF", async () => {
    const own = await createTestClinic({ timeZone: "America/Toronto" });
    const { visit, user } = await createVisit(own, { startsAt: hoursFromNow(70) });
    const doc = await PDFDocument.create();
    doc.addPage().drawText("Consent copy for a test");
    const pdf = Buffer.from(await doc.save());
    const first = await sendConsentCopy({ appointmentId: visit.id, pdf, filename: "consent-copy.pdf" });
    await sendConsentCopy({ appointmentId: visit.id, pdf, filename: "consent-copy.pdf" });
    await drainMailOnce({ clinicId: own.clinic.id });
    const copies = await eventually(async () => {
      const m = (await caughtFor(user.email)).filter((x) => x.subject === "Your copy of your signed consent");
      return m.length ? m : null;
    });
    await new Promise((r) => setTimeout(r, 300));
    expect((await caughtFor(user.email)).filter((x) => x.subject === "Your copy of your signed consent")).toHaveLength(1);
    expect(copies[0].attachments?.map((a) => [a.filename, a.contentType])).toEqual([["consent-copy.pdf", "application/pdf"]]);
    const attached = await fetch(`${catcherUrl}/api/email/${copies[0].id}/attachment/${copies[0].attachments![0].generatedFileName}`).then((r) => r.arrayBuffer());
    expect(Buffer.from(attached).equals(pdf)).toBe(true);
    // Two requests for the same PDF share one key: one is sent, the other never is.
    const rows = await MailOutbox.findAll({ where: { appointmentId: visit.id, kind: "consent_copy" } });
    expect(rows.map((r) => r.id)).toContain(first.outboxId);
    expect(rows.filter((r) => r.state === "sent")).toHaveLength(1);
    await expect(sendConsentCopy({ appointmentId: visit.id, pdf: Buffer.from("not a pdf"), filename: "x.pdf" })).rejects.toThrow(/PDF/);
  });

  it("two workers delivering the same message at once send it once", async () => {
    const { visit, user } = await createVisit(t, { startsAt: hoursFromNow(90) });
    const [row] = await outbox(visit.id);
    await row.update({ state: "queued" });
    const results = await Promise.allSettled([
      deliverOutboxMessage(row.id, { attempt: 1, finalAttempt: false }),
      deliverOutboxMessage(row.id, { attempt: 1, finalAttempt: false }),
    ]);
    const outcomes = results.map((r) => (r.status === "fulfilled" ? r.value : (r.reason as Error).name)).sort();
    expect(outcomes.filter((o) => o === "sent")).toHaveLength(1);
    await new Promise((r) => setTimeout(r, 300));
    expect(await caughtFor(user.email)).toHaveLength(1);
    const [sends] = await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM mail_sends WHERE idempotency_key = $1 AND state = 'sent'`, {
      bind: [row.idempotencyKey],
      type: QueryTypes.SELECT,
    });
    expect(Number(sends.n)).toBe(1);
  });
});

describe("a mail server that is down", () => {
  it("keeps the reminder, retries with backoff, and delivers it once when the server is back", async () => {
    const own = await createTestClinic({ timeZone: "America/Toronto" });
    const port = await freePort();
    const catcher = new LocalCatcher(port);
    await catcher.start();
    // Not pooled: every attempt opens a fresh connection, so a stopped server is refused at once.
    const transport = nodemailer.createTransport({ host: "127.0.0.1", port, secure: false, ignoreTLS: true, connectionTimeout: 2000 });
    try {
      const { visit } = await createVisit(own, { startsAt: hoursFromNow(30), status: "confirmed" });
      await drainMailOnce({ clinicId: own.clinic.id, transport });
      expect(catcher.mails.map((m) => m.subject)).toEqual([expect.stringMatching(/^Confirmed:/)]);

      const reminder = (await outbox(visit.id)).find((r) => r.kind === "reminder" && r.state === "pending")!;
      const at = new Date(reminder.dueAt.getTime() + 60_000);
      await catcher.stop();
      const first = await drainMailOnce({ clinicId: own.clinic.id, transport, now: at, retryDelaySeconds: 1 });
      expect(first.failed).toBe(1);
      expect(first.sent).toBe(0);
      expect((await reminder.reload()).state).toBe("queued");
      const [job] = await sequelize.query<{ state: string; retry_count: number }>(
        `SELECT state, retry_count FROM pgboss.job WHERE id = $1`,
        { bind: [reminder.id], type: QueryTypes.SELECT },
      );
      expect(job.state).toBe("retry");

      await catcher.start();
      // pg-boss releases the retry after its backoff delay; keep draining until it goes out.
      await eventually(async () => {
        await drainMailOnce({ clinicId: own.clinic.id, transport, now: at, retryDelaySeconds: 1 });
        return catcher.mails.length >= 2;
      }, 15_000, 500);
      await drainMailOnce({ clinicId: own.clinic.id, transport, now: at });
      expect(catcher.mails.filter((m) => m.subject.startsWith("Reminder:"))).toHaveLength(1);
      expect((await reminder.reload()).state).toBe("sent");
      const attempts = await MailAttempt.findAll({ where: { outboxId: reminder.id }, order: [["id", "ASC"]] });
      expect(attempts.map((a) => [a.attempt, a.outcome])).toEqual([[1, "retrying"], [2, "sent"]]);
    } finally {
      await catcher.stop();
      transport.close();
    }
  });
});
