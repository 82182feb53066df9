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
import DepositReceiptEmail from "@/emails/deposit-receipt";
import ReminderEmail from "@/emails/reminder";
import VisitConfirmedEmail from "@/emails/visit-confirmed";
import VisitEndedEmail from "@/emails/visit-ended";
import VisitMovedEmail from "@/emails/visit-moved";
import VisitRequestedEmail from "@/emails/visit-requested";
import type { VisitMailProps } from "@/emails/parts/visit-details";
import type { AppointmentStatus } from "@/lib/domain/types";
import { durationWords, reminderHours, reminderStillUseful, timeUntilWords } from "@/lib/domain/reminders";
import { visitCalendar } from "@/lib/domain/visit-calendar";
import { shortWhen } from "@/lib/domain/visit-when";
import { receiptNumber } from "@/lib/domain/money";
import { emailTranslator, lengthWords, localShortWhen, localVisitWhen, timeUntil, type EmailT } from "@/lib/i18n/email";
import { formatList, formatMoney } from "@/lib/i18n/format";
import { when as whenInZone } from "@/lib/format";
import { isLocale, type Locale } from "@/lib/i18n/locale";
import { toothWords } from "@/lib/i18n/tooth-words";
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

export type VisitRow = {
  id: string;
  proposalId: string;
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
  /** The patient's language, and the material's name in French where the clinic keeps one. */
  language?: string | null;
  materialNameFr?: string | null;
  /** Due times of this visit's other live reminders for the same start (to drop a superseded one). */
  otherReminderDueAts: Date[] | null;
  /** The latest calendar SEQUENCE sent for this visit (reminders repeat it). */
  latestSequence: number | null;
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

/** The outbox row and the visit as it is now, in one round trip. */
export async function loadMessage(outboxId: string): Promise<{ row: OutboxRow & { state: string }; visit: VisitRow | null } | null> {
  const [r] = await sequelize.query<OutboxRow & { state: string; visit: VisitRow | null }>(
    `SELECT o.id, o.appointment_id AS "appointmentId", o.kind, o.hours_before AS "hoursBefore", o.visit_starts_at AS "visitStartsAt",
            o.idempotency_key AS "idempotencyKey", o.due_at AS "dueAt", o.data, o.attachment, o.state,
            (SELECT json_build_object(
               'id', a.id, 'proposalId', a.proposal_id, 'status', a.status, 'startsAt', a.starts_at, 'endsAt', a.ends_at, 'tooth', a.tooth,
               'remindersEnabled', a.reminders_enabled, 'statusReason', a.status_reason,
               'clinicName', c.name, 'clinicAddress', c.address, 'clinicPhone', c.phone, 'timeZone', c.time_zone,
               'reminderHoursSetting', c.settings->'reminderHoursBefore', 'email', u.email, 'patientName', u.name, 'materialName', m.name,
               'language', p.language, 'materialNameFr', m.translations->'fr'->>'name',
               'otherReminderDueAts', (SELECT json_agg(x.due_at) FROM mail_outbox x
                  WHERE x.appointment_id = a.id AND x.kind = 'reminder' AND x.visit_starts_at = o.visit_starts_at
                    AND x.id <> o.id AND x.state IN ('pending', 'queued', 'sent')),
               'latestSequence', (SELECT max((x.data->>'sequence')::int) FROM mail_outbox x
                  WHERE x.appointment_id = a.id AND x.kind IN ('visit_confirmed', 'visit_moved') AND (x.data->>'calendar')::boolean))
               FROM appointments a
               JOIN clinics c ON c.id = a.clinic_id
               JOIN patients p ON p.id = a.patient_id
               JOIN users u ON u.id = p.user_id
               JOIN materials m ON m.id = a.material_id
              WHERE a.id = o.appointment_id) AS visit
       FROM mail_outbox o WHERE o.id = $1`,
    { bind: [outboxId], type: QueryTypes.SELECT },
  );
  if (!r) return null;
  const { visit, ...row } = r;
  if (!visit) return { row, visit: null };
  // json_build_object hands back timestamps as text.
  return {
    row,
    visit: {
      ...visit,
      startsAt: new Date(visit.startsAt),
      endsAt: new Date(visit.endsAt),
      otherReminderDueAts: visit.otherReminderDueAts?.map((d) => new Date(d)) ?? null,
    },
  };
}

/** Why a message is no longer worth sending at `now`, or null when it still is. */
function staleReason(row: OutboxRow, visit: VisitRow, now: Date): string | null {
  const sameTime = visit.startsAt.getTime() === new Date(row.visitStartsAt).getTime();
  const state = visit.status.replace("_", " ");
  switch (row.kind) {
    case "visit_requested":
      return visit.status === "requested" ? null : "The request was answered before this e-mail went out.";
    case "visit_confirmed":
      return ["confirmed", "checked_in", "in_progress"].includes(visit.status) ? null : `The visit is ${state} now.`;
    case "visit_moved":
      if (!["requested", "confirmed"].includes(visit.status)) return `The visit is ${state} now.`;
      return sameTime ? null : "The visit moved again; a newer message covers it.";
    case "reminder": {
      if (visit.status !== "confirmed") return `The visit is ${state} now.`;
      if (!visit.remindersEnabled) return "The patient turned reminders off.";
      if (!sameTime) return "The visit moved; its reminders were replaced.";
      const useful = reminderStillUseful({ dueAt: new Date(row.dueAt), visitStartsAt: visit.startsAt }, visit.otherReminderDueAts ?? [], now);
      return useful ? null : "Too late to be useful: the visit has started or a later reminder is due.";
    }
    default:
      return null;
  }
}

function listHours(hours: number[], t: EmailT, locale: Locale): string {
  return t("hoursBefore", { hours: formatList(hours.map((h) => t("hours", { count: h })), locale) });
}

function calendarWords(visit: VisitRow, cancelled: boolean, props: VisitMailProps, locale: Locale) {
  const t = props.t ?? emailTranslator(locale);
  return {
    language: locale,
    summary: t("calendar.summary", { cancelled: cancelled ? "yes" : "no", clinic: visit.clinicName }),
    description: [t("calendar.crownFor", { tooth: props.toothWords, material: props.materialName }), t("calendar.allow", { length: props.lengthWords })],
    alarm: t("calendar.alarm", { clinic: visit.clinicName }),
  };
}

function messageId(key: string): string {
  const domain = mailFromAddress().split("@")[1] ?? "cuspal.test";
  return `<${createHash("sha256").update(key).digest("hex").slice(0, 40)}@${domain}>`;
}

function calendarAttachment(row: OutboxRow, visit: VisitRow, cancelled: boolean, props: VisitMailProps, locale: Locale): Attachment {
  // A reminder carries the latest copy of the visit, so it repeats the latest sequence number.
  const sequence = row.kind === "reminder" ? (visit.latestSequence ?? 0) : Number(row.data.sequence ?? 0);
  const content = visitCalendar({
    appointmentId: visit.id,
    startsAt: visit.startsAt,
    endsAt: visit.endsAt,
    clinicName: visit.clinicName,
    clinicAddress: visit.clinicAddress,
    organizerEmail: mailFromAddress(),
    toothWords: props.toothWords,
    materialName: props.materialName,
    sequence,
    cancelled,
    words: locale === "en" ? undefined : calendarWords(visit, cancelled, props, locale),
  });
  return { filename: "crown-visit.ics", content, contentType: "text/calendar; charset=utf-8; method=PUBLISH" };
}

/** The message for an outbox row, built from the visit as it is now (no database access). */
export async function composeMail(row: OutboxRow, visit: VisitRow | null, now = new Date()): Promise<Composition> {
  if (!visit) return { skip: "The visit no longer exists." };
  const stale = staleReason(row, visit, now);
  if (stale) return { skip: stale };

  const base = (process.env.APP_URL ?? "http://localhost:3000").replace(/\/$/, "");
  // Every e-mail is written in the patient's language, read when it is composed.
  const locale: Locale = isLocale(visit.language) ? visit.language : "en";
  const t = emailTranslator(locale);
  const when = localVisitWhen(visit.startsAt, visit.endsAt, visit.timeZone, locale);
  const minutes = (visit.endsAt.getTime() - visit.startsAt.getTime()) / 60_000;
  const props: VisitMailProps = {
    clinic: { name: visit.clinicName, address: visit.clinicAddress, phone: visit.clinicPhone },
    patientName: visit.patientName ?? "",
    when,
    toothWords: toothWords(visit.tooth, locale),
    materialName: (locale === "fr" && visit.materialNameFr) || visit.materialName,
    lengthWords: locale === "en" ? durationWords(minutes) : lengthWords(minutes, t),
    visitUrl: `${base}/patient/visits/${visit.id}`,
    t,
  };
  const at = locale === "en" ? shortWhen(visit.startsAt, visit.timeZone) : localShortWhen(visit.startsAt, visit.timeZone, locale);
  const attachments: Attachment[] = [];
  const headers: Record<string, string> = { "X-Cuspal-Visit": visit.id };
  let element: ReactElement;
  let subject: string;

  switch (row.kind) {
    case "visit_requested":
      element = createElement(VisitRequestedEmail, props);
      subject = t("requested.subject", { at });
      break;
    case "visit_confirmed": {
      const hours = reminderHours(visit.reminderHoursSetting).filter((h) => visit.startsAt.getTime() - h * 3_600_000 > now.getTime());
      element = createElement(VisitConfirmedEmail, { ...props, reminderText: visit.remindersEnabled && hours.length ? listHours(hours, t, locale) : null });
      subject = t("confirmed.subject", { at });
      attachments.push(calendarAttachment(row, visit, false, props, locale));
      break;
    }
    case "visit_moved": {
      const prev = typeof row.data.previousStartsAt === "string" ? new Date(row.data.previousStartsAt) : null;
      const hasCalendar = Boolean(row.data.calendar);
      const length = visit.endsAt.getTime() - visit.startsAt.getTime();
      element = createElement(VisitMovedEmail, {
        ...props,
        previous: prev ? localVisitWhen(prev, new Date(prev.getTime() + length), visit.timeZone, locale) : null,
        hasCalendar,
      });
      subject = t("moved.subject", { at });
      if (hasCalendar) attachments.push(calendarAttachment(row, visit, false, props, locale));
      break;
    }
    case "visit_declined":
    case "visit_cancelled": {
      const outcome = row.kind === "visit_declined" ? "declined" : "cancelled";
      const hasCalendar = Boolean(row.data.calendar);
      // "Choose another time" leads back to the crown proposal, which stays open.
      element = createElement(VisitEndedEmail, { ...props, visitUrl: `${base}/patient/proposals/${visit.proposalId}`, outcome, reason: visit.statusReason, hasCalendar });
      subject = outcome === "declined" ? t("ended.subjectDeclined", { at }) : t("ended.subjectCancelled", { at });
      if (hasCalendar) attachments.push(calendarAttachment(row, visit, true, props, locale));
      break;
    }
    case "reminder": {
      element = createElement(ReminderEmail, { ...props, leadText: locale === "en" ? timeUntilWords(now, visit.startsAt) : timeUntil(now, visit.startsAt, t), turnOffUrl: reminderLink(visit.id, visit.startsAt) });
      subject = t("reminder.subject", { at });
      attachments.push(calendarAttachment(row, visit, false, props, locale));
      // One-click opt-out from the mail program itself (RFC 8058): a POST, never a GET.
      headers["List-Unsubscribe"] = `<${reminderOneClickUrl(visit.id, visit.startsAt)}>`;
      headers["List-Unsubscribe-Post"] = "List-Unsubscribe=One-Click";
      break;
    }
    case "aftercare":
      element = createElement(AftercareEmail, props);
      subject = t("aftercare.subject");
      break;
    case "consent_copy": {
      const filename = typeof row.data.filename === "string" ? row.data.filename : "consent.pdf";
      if (!row.attachment) return { skip: "The consent PDF is missing." };
      element = createElement(ConsentCopyEmail, { ...props, filename });
      subject = t("consentCopy.subject");
      attachments.push({ filename, content: row.attachment, contentType: "application/pdf" });
      break;
    }
    case "deposit_paid":
    case "deposit_refunded": {
      const paid = row.kind === "deposit_paid";
      const amountText = formatMoney(Number(row.data.amountCents), String(row.data.currency), locale);
      const at = new Date(String(paid ? row.data.paidAt : row.data.refundedAt));
      element = createElement(DepositReceiptEmail, { ...props, kind: paid ? "paid" : "refunded", amountText, atText: whenInZone(at, visit.timeZone, locale), receiptNumber: receiptNumber(String(row.data.depositId), paid ? "paid" : "refunded") });
      subject = paid
        ? t("deposit.subjectPaid", { amount: amountText, at: locale === "en" ? shortWhen(visit.startsAt, visit.timeZone) : localShortWhen(visit.startsAt, visit.timeZone, locale) })
        : t("deposit.subjectRefunded", { amount: amountText });
      break;
    }
    default:
      return { skip: `Unknown kind ${String(row.kind)}.` };
  }

  const { html, text } = await renderEmail(element);
  return { mail: { to: visit.email, subject, html, text, attachments, headers, messageId: messageId(row.idempotencyKey) } };
}
