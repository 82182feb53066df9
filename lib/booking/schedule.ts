// Writes a visit's planned stages and its reservations (one per resource per stage window).
// Free of request concerns so the demo seed can use it too.
import type { Transaction } from "sequelize";
import { AppointmentStage, Reservation, type Appointment } from "@/db/models";
import { holdsFor, type Assignment } from "@/lib/domain/availability";
import type { Timeline } from "@/lib/domain/timeline";

const MIN = 60_000;

/** Writes the planned stages and the reservations of a visit placed at `start`. */
export async function writeSchedule(opts: {
  appointment: Appointment;
  timeline: Timeline;
  start: Date;
  assignment: Assignment;
  bufferMinutes: number;
  transaction: Transaction;
}) {
  const { appointment, timeline, start, assignment, transaction } = opts;
  await AppointmentStage.bulkCreate(
    timeline.stages.map((s, i) => ({
      appointmentId: appointment.id,
      seq: i + 1,
      key: s.key,
      plannedStart: new Date(start.getTime() + s.startMin * MIN),
      plannedEnd: new Date(start.getTime() + s.endMin * MIN),
      equipment: s.equipment,
    })),
    { transaction },
  );
  await Reservation.bulkCreate(
    holdsFor(timeline, start.getTime(), opts.bufferMinutes).map((h) => ({
      appointmentId: appointment.id,
      clinicId: appointment.clinicId,
      resourceKind: h.kind,
      resourceId: assignment[h.kind]!,
      stage: h.stage,
      during: [new Date(h.start), new Date(h.end)] as [Date, Date],
    })),
    { transaction },
  );
}

