// The mill preparation list for a day (from the day board's projected times, so it follows a late
// day), the shade and block size the dentist records, and the "block loaded" mark. Audited writes.
import "server-only";
import { Op } from "sequelize";
import { Appointment, BlockLot, sequelize } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { blockLoadedSchema, visitBlockSchema } from "@/lib/domain/block-schemas";
import { millPrepList, type PrepItem } from "@/lib/domain/mill-prep";
import { recordAudit } from "@/lib/server/audit";
import { conflict, forbidden, notFound } from "@/lib/server/errors";
import { loadBoard } from "./board";
import "@/lib/mail/hooks";

const STAFF = ["reception", "dentist", "admin"];
const LOADABLE = ["confirmed", "checked_in", "in_progress"];

export type MillPrep = { day: string; timezone: string; mills: { id: string; name: string; items: PrepItem[] }[] };

export async function loadMillPrep({ user, day, now = new Date() }: { user: SessionUser; day?: string | null; now?: Date }): Promise<MillPrep> {
  if (!STAFF.includes(user.role) || !user.clinicId) throw forbidden("Only clinic staff see the mill preparation list.");
  const board = await loadBoard({ clinicId: user.clinicId, day, now });
  const ids = board.visits.map((v) => v.id);
  const [rows, lots] = await Promise.all([
    Appointment.findAll({ where: { id: { [Op.in]: ids }, clinicId: user.clinicId }, attributes: ["id", "shade", "blockSize", "blockLoadedAt"] }),
    BlockLot.findAll({ where: { appointmentId: { [Op.in]: ids }, clinicId: user.clinicId }, order: [["recordedAt", "ASC"]] }),
  ]);
  const byId = new Map(rows.map((r) => [r.id, r]));
  const visits = board.visits.flatMap((v) => {
    const fab = v.stages.find((s) => s.key === "fabrication");
    if (!fab || !["requested", "confirmed", "checked_in", "in_progress", "completed"].includes(v.status)) return [];
    const row = byId.get(v.id);
    return [{
      id: v.id,
      initials: v.initials,
      tooth: v.tooth.fdi,
      material: v.material,
      shade: row?.shade ?? null,
      blockSize: row?.blockSize ?? null,
      millId: v.lanes.mill,
      fabricationStart: new Date(fab.start).getTime(),
      fabricationEnd: new Date(fab.end).getTime(),
      fabricationDone: fab.actualEnd !== null,
      loadedAt: row?.blockLoadedAt?.getTime() ?? null,
      lots: lots.filter((l) => l.appointmentId === v.id).map((l) => l.lot),
    }];
  });
  const list = millPrepList(visits, now.getTime());
  const mills = board.lanes.filter((l) => l.kind === "mill").map((l) => ({ id: l.id, name: l.name, items: list.get(l.id) ?? [] }));
  return { day: board.day, timezone: board.timezone, mills };
}

async function staffVisit(user: SessionUser, appointmentId: string, transaction: import("sequelize").Transaction) {
  const visit = await Appointment.findOne({ where: { id: appointmentId, clinicId: user.clinicId! }, transaction, lock: transaction.LOCK.UPDATE });
  if (!visit) throw notFound("That visit");
  return visit;
}

/** The dentist records the shade (VITA classical) and the block size for the visit's crown. */
export async function recordVisitBlock(opts: { user: SessionUser; input: unknown; ip?: string; userAgent?: string }) {
  const { user } = opts;
  if (!["dentist", "admin"].includes(user.role) || !user.clinicId) throw forbidden("The dentist records the shade and block size.");
  const value = visitBlockSchema.parse(opts.input);
  return sequelize.transaction(async (transaction) => {
    const visit = await staffVisit(user, value.appointmentId, transaction);
    if (!LOADABLE.includes(visit.status) && visit.status !== "requested") throw conflict("This visit is over, so its block cannot change.");
    const before = { shade: visit.shade, blockSize: visit.blockSize };
    await visit.update({ shade: value.shade, blockSize: value.blockSize }, { transaction });
    await recordAudit(
      { clinicId: visit.clinicId, actorUserId: user.id, action: "visit.block_planned", subjectType: "appointment", subjectId: visit.id, ip: opts.ip, userAgent: opts.userAgent, data: { before, after: { shade: value.shade, blockSize: value.blockSize } } },
      transaction,
    );
    return { id: visit.id, shade: value.shade, blockSize: value.blockSize };
  });
}

/** Staff mark the visit's block as loaded in its mill (or take the mark back). */
export async function markBlockLoaded(opts: { user: SessionUser; input: unknown; ip?: string; userAgent?: string; now?: Date }) {
  const { user } = opts;
  if (!STAFF.includes(user.role) || !user.clinicId) throw forbidden("Only clinic staff mark blocks.");
  const value = blockLoadedSchema.parse(opts.input);
  const now = opts.now ?? new Date();
  return sequelize.transaction(async (transaction) => {
    const visit = await staffVisit(user, value.appointmentId, transaction);
    if (!LOADABLE.includes(visit.status)) throw conflict(`This visit is ${visit.status.replace("_", " ")}, so no block is loaded for it.`);
    await visit.update(value.loaded ? { blockLoadedAt: now, blockLoadedBy: user.id } : { blockLoadedAt: null, blockLoadedBy: null }, { transaction });
    await recordAudit(
      { clinicId: visit.clinicId, actorUserId: user.id, action: value.loaded ? "visit.block_loaded" : "visit.block_unloaded", subjectType: "appointment", subjectId: visit.id, ip: opts.ip, userAgent: opts.userAgent, data: { millId: visit.millId, at: now.toISOString() } },
      transaction,
    );
    return { id: visit.id, loadedAt: value.loaded ? now : null };
  });
}
