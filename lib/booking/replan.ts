// Moves a visit's reservations to the times its stages are now expected at, inside the caller's
// transaction. Each move runs in its own savepoint, so a move the exclusion constraint refuses (the
// resource is taken by another visit) leaves that reservation where it was and is reported.
import type { Transaction } from "sequelize";
import { AppointmentStage, Reservation, sequelize, type Appointment } from "@/db/models";
import { expectedHolds, movesFor, type Move } from "@/lib/domain/replan";
import type { ResourceKind, StageKey } from "@/lib/domain/types";

export type ReplanConflict = { stage: StageKey; resourceKind: ResourceKind; resourceId: string; wantedStart: string; wantedEnd: string; blockedByAppointmentId: string | null };
export type ReplanResult = { moved: number; conflicts: ReplanConflict[] };

type RangeValue = [{ value: Date | string }, { value: Date | string }] | [Date, Date];

function msRange(during: RangeValue): { start: number; end: number } {
  const [a, b] = during as unknown[];
  const at = (x: unknown) => new Date((x as { value?: Date | string })?.value ?? (x as Date)).getTime();
  return { start: at(a), end: at(b) };
}

export async function replanVisit(opts: { appointment: Appointment; bufferMinutes: number; transaction: Transaction }): Promise<ReplanResult> {
  const { appointment, transaction } = opts;
  const [stages, reservations] = await Promise.all([
    AppointmentStage.findAll({ where: { appointmentId: appointment.id }, order: [["seq", "ASC"]], transaction }),
    Reservation.findAll({ where: { appointmentId: appointment.id, active: true }, transaction }),
  ]);
  const wanted = expectedHolds(
    stages.map((s) => ({
      key: s.key as StageKey,
      plannedStart: s.plannedStart.getTime(),
      plannedEnd: s.plannedEnd.getTime(),
      actualStart: s.actualStart?.getTime() ?? null,
      actualEnd: s.actualEnd?.getTime() ?? null,
      equipment: s.equipment,
    })),
    opts.bufferMinutes,
  );
  const byId = new Map(reservations.map((r) => [String(r.id), r]));
  const moves = movesFor(reservations.map((r) => ({ id: String(r.id), stage: r.stage, kind: r.resourceKind, ...msRange(r.during as RangeValue) })), wanted);

  const result: ReplanResult = { moved: 0, conflicts: [] };
  for (const move of moves) {
    const row = byId.get(String(move.id))!;
    try {
      await sequelize.transaction({ transaction }, async (savepoint) => {
        await Reservation.update({ during: [new Date(move.to.start), new Date(move.to.end)] }, { where: { id: row.id }, transaction: savepoint });
      });
      result.moved++;
    } catch (err) {
      if (String((err as { parent?: { code?: string } })?.parent?.code) !== "23P01") throw err;
      result.conflicts.push({ ...(await describe(move, row.resourceId, appointment.id, transaction)) });
    }
  }
  return result;
}

/** Which other visit holds the resource in the wanted window, for the board and reception. */
async function describe(move: Move, resourceId: string, appointmentId: string, transaction: Transaction): Promise<ReplanConflict> {
  const [rows] = (await sequelize.query(
    `SELECT appointment_id FROM reservations WHERE active AND resource_id = :resourceId AND appointment_id <> :appointmentId
       AND during && tstzrange(:start, :end) ORDER BY lower(during) LIMIT 1`,
    { replacements: { resourceId, appointmentId, start: new Date(move.to.start), end: new Date(move.to.end) }, transaction },
  )) as [{ appointment_id: string }[], unknown];
  return {
    stage: move.stage as StageKey,
    resourceKind: move.kind,
    resourceId,
    wantedStart: new Date(move.to.start).toISOString(),
    wantedEnd: new Date(move.to.end).toISOString(),
    blockedByAppointmentId: rows[0]?.appointment_id ?? null,
  };
}
