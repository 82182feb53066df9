// Model hooks that turn visit changes into outbox rows, in the same transaction as the change
// (options.transaction), so a visit change and its e-mails commit or roll back together.
// Booking code changes visits with instance methods (create / update / save), which run these.
import type { CreateOptions, InstanceUpdateOptions } from "sequelize";
import type { Appointment } from "@/db/models/appointment";
import type { AppointmentStatus } from "@/lib/domain/types";
import { cancelReminders, enqueueMail, nextCalendarSequence, reminderRows, type OutboxInsert } from "./outbox";

const HOOK = "cuspal-visit-mail";
const ACTIVE: AppointmentStatus[] = ["requested", "confirmed", "checked_in", "in_progress"];
// A visit that enters "confirmed" from one of these gets a confirmation (and reminders).
const CONFIRMS_FROM: AppointmentStatus[] = ["requested", "declined", "cancelled", "no_show"];

type Options = (CreateOptions | InstanceUpdateOptions) & { transaction?: InstanceUpdateOptions["transaction"] };

function message(visit: Appointment, kind: OutboxInsert["kind"], data: Record<string, unknown> = {}): OutboxInsert {
  return { clinicId: visit.clinicId, appointmentId: visit.id, kind, visitStartsAt: visit.startsAt, data };
}

async function confirmation(visit: Appointment, options: Options): Promise<OutboxInsert[]> {
  const sequence = await nextCalendarSequence(visit.id, options.transaction);
  const rows = [message(visit, "visit_confirmed", { calendar: true, sequence })];
  if (visit.remindersEnabled) rows.push(...(await reminderRows(visit, options.transaction, "the visit was confirmed")));
  return rows;
}

export async function afterVisitCreate(visit: Appointment, options: Options) {
  if (visit.status === "requested") await enqueueMail([message(visit, "visit_requested")], options.transaction);
  // The demo seed (and any import) may create a visit that is confirmed from the start.
  else if (visit.status === "confirmed") await enqueueMail(await confirmation(visit, options), options.transaction);
}

export async function afterVisitUpdate(visit: Appointment, options: Options) {
  const t = options.transaction;
  const from = visit.previous("status") as AppointmentStatus | undefined;
  const to = visit.status;
  const statusChanged = visit.changed("status") !== false && from !== undefined && from !== to;
  const before = visit.previous("startsAt") as Date | undefined;
  const moved = visit.changed("startsAt") !== false && before !== undefined && new Date(before).getTime() !== visit.startsAt.getTime();
  const rows: OutboxInsert[] = [];

  if (statusChanged) {
    if (to !== "confirmed") await cancelReminders(visit.id, `The visit is now ${to.replace("_", " ")}.`, t);
    if (to === "confirmed" && CONFIRMS_FROM.includes(from)) {
      if (moved) await cancelReminders(visit.id, "The visit moved.", t);
      rows.push(...(await confirmation(visit, options)));
    } else if (to === "declined" || to === "cancelled") {
      // A calendar copy is only worth cancelling if the patient was sent one.
      const hadCalendar = from !== "requested";
      const sequence = hadCalendar ? await nextCalendarSequence(visit.id, t) : 0;
      rows.push(message(visit, to === "declined" ? "visit_declined" : "visit_cancelled", { calendar: hadCalendar, sequence }));
    } else if (to === "completed") {
      rows.push(message(visit, "aftercare"));
    } else if (moved && to === "requested") {
      // Moved back to a request (the clinic must confirm the new time): tell the patient, no calendar yet.
      rows.push(message(visit, "visit_moved", { calendar: false, sequence: 0, previousStartsAt: new Date(before!).toISOString() }));
    }
  } else if (moved && ACTIVE.includes(to)) {
    const hasCalendar = to !== "requested";
    const sequence = hasCalendar ? await nextCalendarSequence(visit.id, t) : 0;
    rows.push(message(visit, "visit_moved", { calendar: hasCalendar, sequence, previousStartsAt: new Date(before!).toISOString() }));
    await cancelReminders(visit.id, "The visit moved.", t);
    if (to === "confirmed" && visit.remindersEnabled) rows.push(...(await reminderRows(visit, t, "the visit was moved")));
  }

  if (!statusChanged && !moved && visit.changed("remindersEnabled") !== false && visit.previous("remindersEnabled") !== visit.remindersEnabled) {
    if (!visit.remindersEnabled) await cancelReminders(visit.id, "The patient turned reminders off.", t);
    else if (to === "confirmed") rows.push(...(await reminderRows(visit, t, "reminders were turned back on")));
  }

  await enqueueMail(rows, t);
}

/** Registers the hooks on the Appointment model (idempotent: re-running replaces them). */
export function registerVisitMailHooks(model: typeof Appointment) {
  model.removeHook("afterCreate", HOOK);
  model.removeHook("afterUpdate", HOOK);
  model.addHook("afterCreate", HOOK, (visit: Appointment, options: Options) => afterVisitCreate(visit, options));
  model.addHook("afterUpdate", HOOK, (visit: Appointment, options: Options) => afterVisitUpdate(visit, options));
}
