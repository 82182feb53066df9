// The work of the reminder benchmark (see reminders.ts), run as its own process on the bench
// database. Prints one JSON line of figures at the end.
import { performance } from "node:perf_hooks";
import nodemailer from "nodemailer";
import { QueryTypes } from "sequelize";
import { Appointment, Patient, Proposal, User, sequelize } from "@/db/models";
import { drainMailOnce, stopBoss } from "@/lib/jobs/mail-queue";
import { createTestClinic } from "../support/fixtures";
import { freePort, LocalCatcher } from "../support/mail";

const VISITS = Number(process.env.VISITS ?? 1000);
const HOUR = 3_600_000;

async function main() {
  const t = await createTestClinic({ timeZone: "America/Toronto", chairs: 3, mills: 2 });
  const chair = t.equipment.find((e) => e.kind === "chair")!;
  const mill = t.equipment.find((e) => e.kind === "mill")!;
  const zr = t.materialByKey["zirconia"];

  // Patients, proposals and requested visits in bulk (no hooks); all start at the same hour,
  // three days ahead, so each reminder round falls due at one moved clock.
  const start = new Date(Date.now() + 72 * HOUR);
  start.setUTCMinutes(0, 0, 0);
  const users = await User.bulkCreate(
    Array.from({ length: VISITS }, (_, i) => ({ email: `bench-mail-${t.tag}-${i}@cuspal.test`, name: `Bench patient ${i}`, role: "patient" as const, clinicId: t.clinic.id, passwordHash: null, emailVerified: null })),
    { returning: true },
  );
  const patients = await Patient.bulkCreate(users.map((u) => ({ userId: u.id, clinicId: t.clinic.id, dateOfBirth: null, phone: null })), { returning: true });
  const proposals = await Proposal.bulkCreate(
    patients.map((p) => ({ clinicId: t.clinic.id, patientId: p.id, dentistId: t.staff.dentist.id, tooth: 36, feeCents: 100000, note: null })),
    { returning: true },
  );
  const visits = await Appointment.bulkCreate(
    proposals.map((p) => ({
      clinicId: t.clinic.id, proposalId: p.id, patientId: p.patientId, dentistId: t.staff.dentist.id, materialId: zr.id, mode: "standard" as const,
      tooth: 36, status: "requested" as const, startsAt: start, endsAt: new Date(start.getTime() + 150 * 60_000),
      chairId: chair.id, millId: mill.id, furnaceId: null, feeCents: 100000, createdBy: null,
    })),
    { returning: true },
  );

  // Confirm each visit the way the booking code does: an instance update in a transaction.
  const t0 = performance.now();
  for (let i = 0; i < visits.length; i += 8) {
    await Promise.all(visits.slice(i, i + 8).map((v) => sequelize.transaction((transaction) => v.update({ status: "confirmed" }, { transaction }))));
  }
  const scheduleMs = performance.now() - t0;
  const [{ n: outboxRows }] = await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM mail_outbox WHERE clinic_id = $1`, { bind: [t.clinic.id], type: QueryTypes.SELECT });

  const catcher = new LocalCatcher(await freePort());
  await catcher.start();
  const transport = nodemailer.createTransport({ host: "127.0.0.1", port: catcher.port, secure: false, ignoreTLS: true, pool: true, maxConnections: 4 });
  const drain = (now?: Date) => drainMailOnce({ clinicId: t.clinic.id, transport, now, batchSize: 50, concurrency: 8, limit: 500 });

  const d0 = performance.now();
  const confirmations = await drain();
  const d1 = performance.now();
  const round48 = await drain(new Date(start.getTime() - 48 * HOUR + 60_000));
  const round2 = await drain(new Date(start.getTime() - 2 * HOUR + 60_000));
  const d2 = performance.now();
  const again = await drain(new Date(start.getTime() - 2 * HOUR + 120_000));
  transport.close();
  await catcher.stop();

  const expected = VISITS * 3;
  const received = catcher.mails.length;
  const unique = new Set(catcher.mails.map((m) => m.messageId)).size;
  const [{ n: sentRows }] = await sequelize.query<{ n: string }>(
    `SELECT count(*) AS n FROM mail_sends s JOIN mail_outbox o ON o.id = s.outbox_id WHERE o.clinic_id = $1 AND s.state = 'sent'`,
    { bind: [t.clinic.id], type: QueryTypes.SELECT },
  );
  const jobs = confirmations.sent + round48.sent + round2.sent;
  const figures = {
    visits: VISITS,
    "outbox rows written": Number(outboxRows),
    "confirmations scheduled per s": Math.round(VISITS / (scheduleMs / 1000)),
    "messages expected": expected,
    "messages received": received,
    "jobs sent (all rounds)": jobs,
    "jobs per s (all rounds)": Math.round(jobs / ((d2 - d0) / 1000)),
    "reminder jobs per s": Math.round((round48.sent + round2.sent) / ((d2 - d1) / 1000)),
    "failed attempts": confirmations.failed + round48.failed + round2.failed,
    "sent again on a second pass": again.sent,
    "sent keys in mail_sends": Number(sentRows),
    lost: expected - unique,
    duplicated: received - unique,
  };
  await stopBoss();
  await sequelize.close();
  console.log(JSON.stringify(figures));
}

main().catch((err) => {
  console.error(err instanceof Error ? err.stack : err);
  process.exit(1);
});
