// Equipment status: a chair, mill or furnace out of service for a time range, and the booked
// visits that need it then (for reception to move). Availability and the board read the same rows.
import "server-only";
import { Op } from "sequelize";
import { Appointment, Clinic, Equipment, EquipmentOutage, Material, Patient, Reservation, User, sequelize } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { outageSchema, type OutageInput } from "@/lib/domain/outage-schema";
import { isoInZone, zonedTime } from "@/lib/domain/time-zone";
import { describeTooth } from "@/lib/domain/tooth";
import { recordAudit } from "@/lib/server/audit";
import { conflict, notFound, unprocessable } from "@/lib/server/errors";
import { rangeOf } from "./board";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const HOLDING = ["requested", "confirmed", "checked_in", "in_progress"];

export type AffectedVisit = { id: string; status: string; patientName: string; start: string; tooth: string; material: string; stages: string[] };

/** Visits whose active reservations on the equipment overlap [start, end). */
export async function listAffectedVisits({ clinicId, equipmentId, start, end }: { clinicId: string; equipmentId: string; start: Date; end: Date }): Promise<AffectedVisit[]> {
  const clinic = (await Clinic.findByPk(clinicId))!;
  const holds = await Reservation.findAll({
    where: { clinicId, resourceId: equipmentId, active: true, during: { [Op.overlap]: [start, end] } },
    attributes: ["appointmentId", "stage"],
  });
  if (holds.length === 0) return [];
  const visits = await Appointment.findAll({
    where: { id: { [Op.in]: [...new Set(holds.map((h) => h.appointmentId))] }, clinicId, status: { [Op.in]: HOLDING } },
    include: [
      { model: Patient, as: "patient", include: [{ model: User, as: "user", attributes: ["name"] }] },
      { model: Material, as: "material", attributes: ["name"] },
    ],
    order: [["startsAt", "ASC"]],
  });
  return visits.map((v) => ({
    id: v.id,
    status: v.status,
    patientName: v.patient?.user?.name ?? "—",
    start: isoInZone(v.startsAt, clinic.timeZone),
    tooth: describeTooth(v.tooth).label,
    material: v.material?.name ?? "",
    stages: [...new Set(holds.filter((h) => h.appointmentId === v.id).map((h) => h.stage))],
  }));
}

export type OutageView = {
  id: number;
  equipmentId: string;
  equipmentName: string;
  kind: string;
  start: string;
  end: string;
  reason: string | null;
  current: boolean;
  affected: AffectedVisit[];
};

/** Out-of-service ranges of the clinic's equipment that have not ended yet, with the visits they touch. */
export async function listOutages({ clinicId, now = new Date() }: { clinicId: string; now?: Date }): Promise<OutageView[]> {
  const clinic = (await Clinic.findByPk(clinicId))!;
  const equipment = await Equipment.findAll({ where: { clinicId } });
  const byId = new Map(equipment.map((e) => [e.id, e]));
  const rows = await EquipmentOutage.findAll({
    where: { equipmentId: { [Op.in]: equipment.map((e) => e.id) }, [Op.and]: [sequelize.where(sequelize.fn("upper", sequelize.col("during")), Op.gt, now)] },
    order: [["id", "ASC"]],
  });
  const out: OutageView[] = [];
  for (const o of rows) {
    const r = rangeOf(o.during);
    const e = byId.get(o.equipmentId)!;
    out.push({
      id: Number(o.id), equipmentId: e.id, equipmentName: e.name, kind: e.kind,
      start: isoInZone(r.start, clinic.timeZone), end: isoInZone(r.end, clinic.timeZone), reason: o.reason,
      current: r.start <= now && now < r.end,
      affected: await listAffectedVisits({ clinicId, equipmentId: e.id, start: r.start, end: r.end }),
    });
  }
  return out.sort((a, b) => a.start.localeCompare(b.start));
}

/** Marks equipment out of service; the range is in clinic-local wall-clock time. */
export async function createOutage(opts: { user: SessionUser; input: unknown; ip?: string; userAgent?: string }) {
  const input: OutageInput = outageSchema.parse(opts.input);
  const { user } = opts;
  const equipment = UUID.test(input.equipmentId) ? await Equipment.findByPk(input.equipmentId) : null;
  if (!equipment || equipment.clinicId !== user.clinicId) throw notFound("That equipment");
  const clinic = (await Clinic.findByPk(equipment.clinicId))!;
  const [sd, st] = input.start.split("T");
  const [ed, et] = input.end.split("T");
  const start = zonedTime(sd, st, clinic.timeZone);
  const end = zonedTime(ed, et, clinic.timeZone);
  // Checked again on instants: a range across a daylight-saving change can collapse.
  if (!(end > start)) throw unprocessable("The out-of-service range must end after it starts.", "end");

  const row = await sequelize.transaction(async (transaction) => {
    const created = await EquipmentOutage.create(
      { equipmentId: equipment.id, during: [start, end], reason: input.reason?.trim() || null, createdBy: user.id },
      { transaction },
    );
    await recordAudit(
      {
        clinicId: clinic.id, actorUserId: user.id, action: "equipment.out_of_service", subjectType: "equipment", subjectId: equipment.id,
        ip: opts.ip, userAgent: opts.userAgent, data: { outageId: created.id, start: start.toISOString(), end: end.toISOString(), reason: input.reason ?? null },
      },
      transaction,
    );
    return created;
  });
  const affected = await listAffectedVisits({ clinicId: clinic.id, equipmentId: equipment.id, start, end });
  return { id: Number(row.id), equipmentId: equipment.id, start: isoInZone(start, clinic.timeZone), end: isoInZone(end, clinic.timeZone), affected };
}

/** Back in service: a range not started yet is removed; a current one ends now. */
export async function endOutage(opts: { user: SessionUser; outageId: string; ip?: string; userAgent?: string; now?: Date }) {
  const now = opts.now ?? new Date();
  const id = /^\d{1,15}$/.test(opts.outageId) ? Number(opts.outageId) : null;
  const row = id ? await EquipmentOutage.findByPk(id, { include: [{ model: Equipment, as: "equipment" }] }) : null;
  const equipment = (row as (EquipmentOutage & { equipment?: Equipment }) | null)?.equipment;
  if (!row || !equipment || equipment.clinicId !== opts.user.clinicId) throw notFound("That out-of-service range");
  const r = rangeOf(row.during);
  if (r.end <= now) throw conflict("That out-of-service range has already ended.");
  await sequelize.transaction(async (transaction) => {
    if (r.start >= now) await row.destroy({ transaction });
    else await row.update({ during: [r.start, now] }, { transaction });
    await recordAudit(
      {
        clinicId: equipment.clinicId, actorUserId: opts.user.id, action: "equipment.back_in_service", subjectType: "equipment", subjectId: equipment.id,
        ip: opts.ip, userAgent: opts.userAgent, data: { outageId: id, removed: r.start >= now },
      },
      transaction,
    );
  });
  return { id, ended: true };
}
