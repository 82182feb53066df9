// Builds the e-mail for one outbox row from the visit as it is now, or says why it should not go
// out any more (the visit moved, ended, or the patient turned reminders off in the meantime).
import { createHash } from "node:crypto";
import { createElement, type ReactElement } from "react";
import { QueryTypes } from "sequelize";
import type { Attachment } from "nodemailer/lib/mailer";
import { sequelize } from "@/db/sequelize";
import type { MailKind } from "@/db/models/mail";
import AftercareEmail from "@/emails/aftercare";
import ConsentCopyEmail from "@/emails/consent-copy";
import ReminderEmail from "@/emails/reminder";
import VisitConfirmedEmail from "@/emails/visit-confirmed";
import VisitEndedEmail from "@/emails/visit-ended";
import VisitMovedEmail from "@/emails/visit-moved";
import VisitRequestedEmail from "@/emails/visit-requested";
import type { VisitMailProps } from "@/emails/parts/visit-details";
import { describeTooth } from "@/lib/domain/tooth";
import type { AppointmentStatus } from "@/lib/domain/types";
import { durationWords, reminderHours, reminderStillUseful, timeUntilWords } from "@/lib/domain/reminders";
import { visitCalendar } from "@/lib/domain/visit-calendar";
import { shortWhen, visitWhen } from "@/lib/domain/visit-when";
import { renderEmail } from "./render";
import { reminderLink, reminderOneClickUrl } from "./reminder-token";
import { mailFromAddress } from "./transport";

export type OutboxRow = {
  id: string;
  appointmentId: string;
  kind: MailKind;
  hoursBefore: number | null;
  visitStartsAt: Date;
  idempotencyKey: string;
  dueAt: Date;
  data: Record<string, unknown>;
  attachment: Buffer | null;
};

type VisitRow = {
  id: string;
  status: AppointmentStatus;
  startsAt: Date;
  endsAt: Date;
  tooth: number;
  remindersEnabled: boolean;
  statusReason: string | null;
  clinicName: string;
  clinicAddress: string;
  clinicPhone: string | null;
  timeZone: string;
  reminderHoursSetting: unknown;
  email: string;
  patientName: string | null;
  materialName: string;
};

export type ComposedMail = {
  to: string;
  subject: string;
  html: string;
  text: string;
  attachments: Attachment[];
  headers: Record<string, string>;
  messageId: string;
};

export type Composition = { skip: string } | { mail: ComposedMail };

export async function loadVisit(appointmentId: string): Promise<VisitRow | null> {
  const [row] = await sequelize.query<VisitRow>(
    `SELECT a.id, a.status, a.starts_at AS "startsAt", a.ends_at AS "endsAt", a.tooth, a.reminders_enabled AS "remindersEnabled",
            a.status_reason AS "statusReason", c.name AS "clinicName", c.address AS "clinicAddress", c.phone AS "clinicPhone",
            c.time_zone AS "timeZone", c.settings->'reminderHoursBefore' AS "reminderHoursSetting",
            u.email, u.name AS "patientName", m.name AS "materialName"
       FROM appointments a
       JOIN clinics c ON c.id = a.clinic_id
       JOIN patients p ON p.id = a.patient_id
       JOIN users u ON u.id = p.user_id
       JOIN materials m ON m.id = a.material_id
      WHERE a.id = $1`,
    { bind: [appointmentId], type: QueryTypes.SELECT },
  );
  return row ?? null;
}

/** Why a message is no longer worth sending at `now`, or null when it still is. */
async function staleReason(row: OutboxRow, visit: VisitRow, now: Date): Promise<string | null> {
  const sameTime = visit.startsAt.getTime() === new Date(row.visitStartsAt).getTime();
  switch (row.kind) {
    case "visit_requested":
      return visit.status === "requested" ? null : "The request was answered before this e-mail went out.";
    case "visit_confirmed":
      return ["confirmed", "checked_in", "in_progress"].includes(visit.status) ? null : `The visit is ${visit.status.replace("_", " ")} now.`;
    case "visit_moved":
      if (!["requested", "confirmed"].includes(visit.status)) return `The visit is ${visit.status.replace("_", " ")} now.`;
      return sameTime ? null : "The visit moved again; a newer message covers it.";
    case "reminder": {
      if (visit.status !== "confirmed") return `The visit is ${visit.status.replace("_", " ")} now.`;
      if (!visit.remindersEnabled) return "The patient turned reminders off.";
      if (!sameTime) return "The visit moved; its reminders were replaced.";
      const [later] = await sequelize.query<{ dueAts: Date[] | null }>(
        `SELECT array_agg(due_at) AS "dueAts" FROM mail_outbox
          WHERE appointment_id = $1 AND kind = 'reminder' AND visit_starts_at = $2 AND id <> $3 AND state IN ('pending', 'queued', 'sent')`,
        { bind: [row.appointmentId, row.visitStartsAt, row.id], type: QueryTypes.SELECT },
      );
      const useful = reminderStillUseful({ dueAt: new Date(row.dueAt), visitStartsAt: visit.startsAt }, (later?.dueAts ?? []).map((d) => new Date(d)), now);
      return useful ? null : "Too late to be useful: the visit has started or a later reminder is due.";
    }
    default:
      return null;
  }
}

function listHours(hours: number[]): string {
  const words = hours.map((h) => `${h} hour${h === 1 ? "" : "s"}`);
  return words.length > 1 ? `${words.slice(0, -1).join(", ")} and ${words.at(-1)} before` : `${words[0]} before`;
}

function messageId(key: string): string {
  const domain = mailFromAddress().split("@")[1] ?? "cuspal.test";
  return `<${createHash("sha256").update(key).digest("hex").slice(0, 40)}@${domain}>`;
}

async function calendarAttachment(row: OutboxRow, visit: VisitRow, cancelled: boolean): Promise<Attachment> {
  let sequence = Number(row.data.sequence ?? 0);
  if (row.kind === "reminder") {
    // A reminder carries the latest copy of the visit, so it uses the latest sequence number.
    const [r] = await sequelize.query<{ s: number | null }>(
      `SELECT max((data->>'sequence')::int) AS s FROM mail_outbox
        WHERE appointment_id = $1 AND kind IN ('visit_confirmed', 'visit_moved') AND (data->>'calendar')::boolean`,
      { bind: [row.appointmentId], type: QueryTypes.SELECT },
    );
    sequence = r?.s ?? 0;
  }
  const content = visitCalendar({
    appointmentId: visit.id,
    startsAt: visit.startsAt,
    endsAt: visit.endsAt,
    clinicName: visit.clinicName,
    clinicAddress: visit.clinicAddress,
    organizerEmail: mailFromAddress(),
    toothWords: describeTooth(visit.tooth).words,
    materialName: visit.materialName,
    sequence,
    cancelled,
  });
  return { filename: "crown-visit.ics", content, contentType: "text/calendar; charset=utf-8; method=PUBLISH" };
}

export async function composeMail(row: OutboxRow, now = new Date()): Promise<Composition> {
  const visit = await loadVisit(row.appointmentId);
  if (!visit) return { skip: "The visit no longer exists." };
  const stale = await staleReason(row, visit, now);
  if (stale) return { skip: stale };

  const base = (process.env.APP_URL ?? "http://localhost:3000").replace(/\/$/, "");
  const when = visitWhen(visit.startsAt, visit.endsAt, visit.timeZone);
  const props: VisitMailProps = {
    clinic: { name: visit.clinicName, address: visit.clinicAddress, phone: visit.clinicPhone },
    patientName: visit.patientName ?? "",
    when,
    toothWords: describeTooth(visit.tooth).words,
    materialName: visit.materialName,
    lengthWords: durationWords((visit.endsAt.getTime() - visit.startsAt.getTime()) / 60_000),
    visitUrl: `${base}/patient`,
  };
  const at = shortWhen(visit.startsAt, visit.timeZone);
  const attachments: Attachment[] = [];
  const headers: Record<string, string> = { "X-Cuspal-Visit": visit.id };
  let element: ReactElement;
  let subject: string;

  switch (row.kind) {
    case "visit_requested":
      element = createElement(VisitRequestedEmail, props);
      subject = `We have your crown visit request for ${at}`;
      break;
    case "visit_confirmed": {
      const hours = reminderHours(visit.reminderHoursSetting).filter((h) => visit.startsAt.getTime() - h * 3_600_000 > now.getTime());
      element = createElement(VisitConfirmedEmail, { ...props, reminderText: visit.remindersEnabled && hours.length ? listHours(hours) : null });
      subject = `Confirmed: your crown visit on ${at}`;
      attachments.push(await calendarAttachment(row, visit, false));
      break;
    }
    case "visit_moved": {
      const prev = typeof row.data.previousStartsAt === "string" ? new Date(row.data.previousStartsAt) : null;
      const hasCalendar = Boolean(row.data.calendar);
      const length = visit.endsAt.getTime() - visit.startsAt.getTime();
      element = createElement(VisitMovedEmail, {
        ...props,
        previous: prev ? visitWhen(prev, new Date(prev.getTime() + length), visit.timeZone) : null,
        hasCalendar,
      });
      subject = `New time: your crown visit is now on ${at}`;
      if (hasCalendar) attachments.push(await calendarAttachment(row, visit, false));
      break;
    }
    case "visit_declined":
    case "visit_cancelled": {
      const outcome = row.kind === "visit_declined" ? "declined" : "cancelled";
      const hasCalendar = Boolean(row.data.calendar);
      element = createElement(VisitEndedEmail, { ...props, outcome, reason: visit.statusReason, hasCalendar });
      subject = outcome === "declined" ? `Your requested crown visit on ${at} could not be confirmed` : `Cancelled: your crown visit on ${at}`;
      if (hasCalendar) attachments.push(await calendarAttachment(row, visit, true));
      break;
    }
    case "reminder": {
      element = createElement(ReminderEmail, { ...props, leadText: timeUntilWords(now, visit.startsAt), turnOffUrl: reminderLink(visit.id) });
      subject = `Reminder: your crown visit on ${at}`;
      attachments.push(await calendarAttachment(row, visit, false));
      // One-click opt-out from the mail program itself (RFC 8058): a POST, never a GET.
      headers["List-Unsubscribe"] = `<${reminderOneClickUrl(visit.id)}>`;
      headers["List-Unsubscribe-Post"] = "List-Unsubscribe=One-Click";
      break;
    }
    case "aftercare":
      element = createElement(AftercareEmail, props);
      subject = "After your crown visit: what is normal and when to call";
      break;
    case "consent_copy": {
      const filename = typeof row.data.filename === "string" ? row.data.filename : "consent.pdf";
      if (!row.attachment) return { skip: "The consent PDF is missing." };
      element = createElement(ConsentCopyEmail, { ...props, filename });
      subject = "Your copy of your signed consent";
      attachments.push({ filename, content: row.attachment, contentType: "application/pdf" });
      break;
    }
    default:
      return { skip: `Unknown kind ${String(row.kind)}.` };
  }

  const { html, text } = await renderEmail(element);
  return { mail: { to: visit.email, subject, html, text, attachments, headers, messageId: messageId(row.idempotencyKey) } };
}
