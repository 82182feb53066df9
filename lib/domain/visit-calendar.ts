// The .ics calendar file attached to visit e-mails (RFC 5545), made with ical-generator.
// Times are written in UTC (a trailing Z), so every calendar places the visit at the right
// instant without needing a VTIMEZONE block, across daylight-saving changes too.
import ical, { ICalAlarmType, ICalCalendarMethod, ICalEventStatus } from "ical-generator";
import { durationWords } from "./reminders";

export type VisitCalendarInput = {
  appointmentId: string;
  startsAt: Date;
  endsAt: Date;
  clinicName: string;
  clinicAddress: string;
  organizerEmail: string;
  toothWords: string;
  materialName: string;
  /** Raised each time the visit changes (RFC 5545 §3.8.7.4), so calendars replace the old copy. */
  sequence: number;
  cancelled?: boolean;
  stamp?: Date;
  /** Minutes before the start for the calendar's own alert. */
  alarmMinutesBefore?: number;
  /** The patient's words for the event (summary, description lines, alert) and language; English when not given. */
  words?: { language: string; summary: string; description: string[]; alarm: string };
};

/** Stable per visit: a calendar that already holds the visit updates it instead of adding a second one. */
export function visitUid(appointmentId: string): string {
  return `visit-${appointmentId}@cuspal`;
}

export function visitCalendar(input: VisitCalendarInput): string {
  const minutes = Math.round((input.endsAt.getTime() - input.startsAt.getTime()) / 60_000);
  const cal = ical({
    prodId: { company: "Cuspal", product: "Crown visits", language: (input.words?.language ?? "en").toUpperCase() },
    // PUBLISH: a copy for the patient's calendar; no reply is expected (RFC 5546 §3.2.1).
    method: ICalCalendarMethod.PUBLISH,
  });
  cal.createEvent({
    id: visitUid(input.appointmentId),
    sequence: input.sequence,
    stamp: input.stamp ?? new Date(),
    start: input.startsAt,
    end: input.endsAt,
    summary: input.words?.summary ?? `${input.cancelled ? "Cancelled: " : ""}Crown visit at ${input.clinicName}`,
    location: `${input.clinicName}, ${input.clinicAddress}`,
    description: (input.words?.description ?? [
      `Same-day crown for your ${input.toothWords} (${input.materialName}).`,
      `Allow the whole visit: about ${durationWords(minutes)}.`,
    ]).join("\n"),
    organizer: { name: input.clinicName, email: input.organizerEmail },
    status: input.cancelled ? ICalEventStatus.CANCELLED : ICalEventStatus.CONFIRMED,
    alarms: input.cancelled
      ? []
      : [{ type: ICalAlarmType.display, trigger: (input.alarmMinutesBefore ?? 120) * 60, description: input.words?.alarm ?? `Crown visit at ${input.clinicName}` }],
  });
  const text = cal.toString();
  // Every content line ends with CRLF, the last one included (RFC 5545 §3.1).
  return text.endsWith("\r\n") ? text : `${text}\r\n`;
}
