// Mail test helpers: visits made straight through the model (so the e-mail hooks run), the
// mail catcher's JSON API, and an in-process SMTP server that can be stopped and started again.
import { createServer } from "node:net";
import { SMTPServer } from "smtp-server";
import { Appointment, sequelize } from "@/db/models";
import type { AppointmentStatus } from "@/lib/domain/types";
import { createTestPatient, createTestProposal, type TestClinic } from "./fixtures";

export async function createVisit(
  t: TestClinic,
  { startsAt, minutes = 150, status = "requested", remindersEnabled = true, tooth = 36 }:
    { startsAt: Date; minutes?: number; status?: AppointmentStatus; remindersEnabled?: boolean; tooth?: number },
) {
  const { user, patient } = await createTestPatient(t.clinic.id, "Ines Testperson");
  const proposal = await createTestProposal(t, patient.id, { tooth });
  const chair = t.equipment.find((e) => e.kind === "chair")!;
  const mill = t.equipment.find((e) => e.kind === "mill")!;
  const visit = await sequelize.transaction((transaction) =>
    Appointment.create(
      {
        clinicId: t.clinic.id, proposalId: proposal.id, patientId: patient.id, dentistId: t.staff.dentist.id,
        materialId: t.materialByKey["zirconia"].id, mode: "standard", tooth, status, startsAt,
        endsAt: new Date(startsAt.getTime() + minutes * 60_000), chairId: chair.id, millId: mill.id, furnaceId: null,
        feeCents: 120000, remindersEnabled, createdBy: null,
      },
      { transaction },
    ),
  );
  return { visit, user, patient };
}

/** Changes a visit the way the booking code does: an instance update inside a transaction. */
export async function changeVisit(id: string, values: Partial<Pick<Appointment, "status" | "startsAt" | "endsAt" | "remindersEnabled" | "statusReason">>) {
  return sequelize.transaction(async (transaction) => {
    const visit = await Appointment.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE, rejectOnEmpty: true });
    return visit.update(values, { transaction });
  });
}

export type CaughtEmail = {
  id: string;
  subject: string;
  to: { address: string }[];
  headers: Record<string, string>;
  attachments?: { filename: string; generatedFileName: string; contentType: string }[];
  text?: string;
  html?: string;
};

export const catcherUrl = process.env.MAIL_CATCHER_URL;

export async function caughtFor(address: string): Promise<CaughtEmail[]> {
  const all = (await fetch(`${catcherUrl}/api/email`).then((r) => r.json())) as CaughtEmail[];
  return all.filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()));
}

export async function caughtAttachment(mail: CaughtEmail, filename: string): Promise<string> {
  const res = await fetch(`${catcherUrl}/api/email/${mail.id}/attachment/${encodeURIComponent(filename)}`);
  if (!res.ok) throw new Error(`Attachment ${filename} not found on the catcher (${res.status}).`);
  return res.text();
}

export async function caughtSource(mail: CaughtEmail): Promise<string> {
  return fetch(`${catcherUrl}/api/email/${mail.id}/source`).then((r) => r.text());
}

/** Waits until `check` returns a truthy value, or fails after `ms`. */
export async function eventually<T>(check: () => Promise<T | null | undefined | false>, ms = 10_000, every = 150): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const v = await check();
    if (v) return v;
    if (Date.now() > until) throw new Error("Timed out waiting.");
    await new Promise((r) => setTimeout(r, every));
  }
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

export type RawMail = { messageId: string; subject: string; to: string; raw: string };

/** An SMTP catcher in this process, on a fixed port, that can be stopped (connection refused) and started again. */
export class LocalCatcher {
  readonly mails: RawMail[] = [];
  private server: SMTPServer | null = null;
  constructor(readonly port: number) {}

  async start() {
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ["STARTTLS"],
      logger: false,
      onData: (stream, _session, callback) => {
        const chunks: Buffer[] = [];
        stream.on("data", (c: Buffer) => chunks.push(c));
        stream.on("end", () => {
          const raw = Buffer.concat(chunks).toString("utf8");
          const header = (name: string) => raw.match(new RegExp(`^${name}:\\s*(.*(?:\\r?\\n[ \\t].*)*)`, "im"))?.[1].replace(/\r?\n[ \t]+/g, " ").trim() ?? "";
          this.mails.push({ messageId: header("Message-ID"), subject: header("Subject"), to: header("To"), raw });
          callback();
        });
      },
    });
    await new Promise<void>((resolve, reject) => {
      server.once("error", reject);
      server.listen(this.port, "127.0.0.1", () => resolve());
    });
    this.server = server;
  }

  async stop() {
    const server = this.server;
    this.server = null;
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }
}
