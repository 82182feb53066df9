// Visit progress: staff mark stages started and finished; the visit's status follows (checked in,
// in progress, completed) through instance updates so the consent guard hook runs. Also the
// estimated-against-actual minutes the clinic uses to tune its stage durations.
import "server-only";
import { Op } from "sequelize";
import { z } from "zod";
import { Appointment, AppointmentStage, Clinic, Material, MaterialMode, StageDuration, sequelize } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { replanVisit, type ReplanResult } from "@/lib/booking/replan";
import { withDefaults } from "@/lib/domain/clinic-settings";
import { checkProgress, TRACKED_STAGES } from "@/lib/domain/day-board";
import { summariseDurations, type DurationSample } from "@/lib/domain/stage-stats";
import { localDate } from "@/lib/domain/time-zone";
import { STAGE_KEYS, type Mode, type StageKey } from "@/lib/domain/types";
import { recordAudit } from "@/lib/server/audit";
import { AppError, notFound, unprocessable } from "@/lib/server/errors";
import { loadBoard, type BoardConflict, type BoardVisit } from "./board";
import { listLotsForVisit } from "./lots";
import "@/lib/mail/hooks";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The body of a stage mark; `at` defaults to now (an earlier time records a stage marked late). */
export const stageMarkSchema = z.object({
  action: z.enum(["start", "finish"], { error: "The action must be start or finish." }),
  at: z.iso.datetime({ offset: true, error: "The time must be an ISO 8601 date and time with its offset." }).optional(),
});
export type StageMark = z.infer<typeof stageMarkSchema>;

export type MarkResult = {
  id: string;
  status: string;
  stage: { key: StageKey; actualStart: string | null; actualEnd: string | null };
  /** Reservations moved to the visit's real times, and those another visit's hold kept in place. */
  replan: ReplanResult;
};

export async function markStage(opts: {
  user: SessionUser;
  appointmentId: string;
  key: string;
  mark: StageMark;
  ip?: string;
  userAgent?: string;
  now?: Date;
}): Promise<MarkResult> {
  const { user, mark } = opts;
  const now = opts.now ?? new Date();
  const at = mark.at ? new Date(mark.at) : now;
  const found = UUID.test(opts.appointmentId) ? await Appointment.findByPk(opts.appointmentId) : null;
  if (!found || found.clinicId !== user.clinicId) throw notFound("That visit");
  const clinic = (await Clinic.findByPk(found.clinicId))!;
  if (localDate(at, clinic.timeZone) !== localDate(found.startsAt, clinic.timeZone)) {
    throw unprocessable(`Stage times must fall on the visit's day (${localDate(found.startsAt, clinic.timeZone)}, clinic time).`, "at");
  }

  return sequelize.transaction(async (transaction) => {
    const visit = (await Appointment.findByPk(found.id, { transaction, lock: transaction.LOCK.UPDATE }))!;
    const stages = await AppointmentStage.findAll({ where: { appointmentId: visit.id }, order: [["seq", "ASC"]], transaction });
    const check = checkProgress({
      status: visit.status,
      stages: stages.map((s) => ({ key: s.key as StageKey, actualStart: s.actualStart?.getTime() ?? null, actualEnd: s.actualEnd?.getTime() ?? null })),
      key: opts.key,
      action: mark.action,
      at: at.getTime(),
    });
    if (!check.ok) throw new AppError(check.status, check.message, { field: check.status === 422 ? "at" : undefined });

    const stage = stages.find((s) => s.key === opts.key)!;
    await stage.update(mark.action === "start" ? { actualStart: at } : { actualEnd: at }, { transaction });
    const from = visit.status;
    // An instance update, so model hooks (the consent guard) can refuse it and roll everything back.
    if (check.statusAfter) {
      try {
        await visit.update({ status: check.statusAfter }, { transaction });
      } catch (err) {
        if (err instanceof AppError && err.options.code === "consent_required") {
          throw new AppError(409, `${err.message} Nothing was recorded: the dentist reviews the signed consent (Consents, or this visit's consent section) first.`, { code: "consent_required" });
        }
        throw err;
      }
    }

    await recordAudit(
      {
        clinicId: visit.clinicId, actorUserId: user.id, action: mark.action === "start" ? "visit.stage_started" : "visit.stage_finished",
        subjectType: "appointment", subjectId: visit.id, ip: opts.ip, userAgent: opts.userAgent,
        data: { stage: stage.key, at: at.toISOString(), ...(check.statusAfter ? { from, to: check.statusAfter } : {}) },
      },
      transaction,
    );
    if (check.statusAfter === "completed") await recordCompletion(visit, stages, user, opts, transaction);
    // The rest of the visit's holds move with it, so new bookings see the day as it really runs.
    const replan = await replanVisit({ appointment: visit, bufferMinutes: withDefaults(clinic.settings).bufferMinutes, transaction });
    if (replan.conflicts.length) {
      await recordAudit(
        {
          clinicId: visit.clinicId, actorUserId: user.id, action: "visit.replan_conflict", subjectType: "appointment", subjectId: visit.id,
          ip: opts.ip, userAgent: opts.userAgent, data: { conflicts: replan.conflicts },
        },
        transaction,
      );
    }
    return {
      replan,
      id: visit.id,
      status: visit.status,
      stage: { key: stage.key as StageKey, actualStart: stage.actualStart?.toISOString() ?? null, actualEnd: stage.actualEnd?.toISOString() ?? null },
    };
  });
}

/** The completion record: actual stage times and the blocks used, kept in the audit trail. */
async function recordCompletion(
  visit: Appointment,
  stages: AppointmentStage[],
  user: SessionUser,
  opts: { ip?: string; userAgent?: string },
  transaction: import("sequelize").Transaction,
) {
  const lots = await listLotsForVisit({ clinicId: visit.clinicId, appointmentId: visit.id });
  await recordAudit(
    {
      clinicId: visit.clinicId, actorUserId: user.id, action: "visit.completed", subjectType: "appointment", subjectId: visit.id,
      ip: opts.ip, userAgent: opts.userAgent,
      data: {
        stages: stages.filter((s) => s.actualStart).map((s) => ({ key: s.key, start: s.actualStart!.toISOString(), end: s.actualEnd?.toISOString() ?? null })),
        lots: lots.map((l) => ({ lot: l.lot, gtin: l.gtin, expiry: l.expiry, serial: l.serial })),
      },
    },
    transaction,
  );
}

export type StageTimeRow = {
  materialId: string;
  material: string;
  mode: Mode;
  stage: StageKey;
  count: number;
  estimatedMinutes: number;
  currentMinutes: number | null;
  medianMinutes: number;
  q1Minutes: number;
  q3Minutes: number;
  minMinutes: number;
  maxMinutes: number;
};

/** Estimated against actual minutes per material, mode and stage, over finished stages of the clinic's visits. */
export async function stageTimeStats({ clinicId, since }: { clinicId: string; since?: Date }): Promise<StageTimeRow[]> {
  const visits = await Appointment.findAll({
    where: { clinicId, ...(since ? { startsAt: { [Op.gte]: since } } : {}) },
    attributes: ["id", "materialId", "mode"],
    include: [{ model: AppointmentStage, as: "stages", where: { actualStart: { [Op.ne]: null }, actualEnd: { [Op.ne]: null } }, required: true }],
  });
  const samples: DurationSample[] = visits.flatMap((v) =>
    (v.stages ?? []).map((s) => ({
      materialId: v.materialId,
      mode: v.mode,
      stage: s.key as StageKey,
      plannedMinutes: (s.plannedEnd.getTime() - s.plannedStart.getTime()) / 60_000,
      actualMinutes: (s.actualEnd!.getTime() - s.actualStart!.getTime()) / 60_000,
    })),
  );
  const summary = summariseDurations(samples, STAGE_KEYS);
  const materials = await Material.findAll({ where: { clinicId }, include: [{ model: MaterialMode, as: "modes" }] });
  const byId = new Map(materials.map((m) => [m.id, m]));
  const general = new Map((await StageDuration.findAll({ where: { clinicId, toothClass: null } })).map((r) => [r.stage, r.minutes]));
  return summary
    .map((s) => {
      const m = byId.get(s.materialId);
      const modeRow = m?.modes?.find((x) => x.mode === s.mode);
      const current = s.stage === "fabrication" ? modeRow?.fabricationMinutes : s.stage === "heat_treatment" ? modeRow?.heatTreatmentMinutes : s.stage === "finishing" ? modeRow?.finishingMinutes : s.stage === "glaze_firing" ? modeRow?.glazeFiringMinutes : general.get(s.stage);
      return { ...s, material: m?.name ?? "Unknown material", currentMinutes: current ?? null };
    })
    .sort((a, b) => a.material.localeCompare(b.material) || a.mode.localeCompare(b.mode) || STAGE_KEYS.indexOf(a.stage) - STAGE_KEYS.indexOf(b.stage));
}

export type VisitProgress = {
  id: string;
  status: string;
  timezone: string;
  day: string;
  tracked: StageKey[];
  visit: BoardVisit;
  conflicts: BoardConflict[];
};

/** One visit's stages as the day board projects them, with the conflicts that concern it. */
export async function loadVisitProgress({ user, appointmentId, now }: { user: SessionUser; appointmentId: string; now?: Date }): Promise<VisitProgress> {
  const visit = UUID.test(appointmentId) ? await Appointment.findByPk(appointmentId) : null;
  if (!visit || visit.clinicId !== user.clinicId) throw notFound("That visit");
  const clinic = (await Clinic.findByPk(visit.clinicId))!;
  const board = await loadBoard({ clinicId: visit.clinicId, day: localDate(visit.startsAt, clinic.timeZone), now });
  const onBoard = board.visits.find((v) => v.id === visit.id);
  if (!onBoard) throw new AppError(409, `This visit is ${visit.status.replace("_", " ")}, so it is not on the day board.`, { code: "not_on_board" });
  return {
    id: visit.id,
    status: visit.status,
    timezone: board.timezone,
    day: board.day,
    tracked: [...TRACKED_STAGES],
    visit: onBoard,
    conflicts: board.conflicts.filter((c) => c.visitId === visit.id || c.blockedByVisitId === visit.id),
  };
}
