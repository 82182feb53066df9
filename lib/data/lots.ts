// Crown blocks used on visits: recording a lot (from the package's GS1 code or typed by hand),
// listing a visit's or a patient's blocks, and finding who received a lot (for a recall).
import "server-only";
import { Op } from "sequelize";
import { z } from "zod";
import { Appointment, BlockLot, Clinic, Material, Patient, User, sequelize } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { Gs1Error, normaliseLot, readBlockCode } from "@/lib/domain/gs1";
import { TEXT_LIMITS } from "@/lib/domain/text-limits";
import { localDate } from "@/lib/domain/time-zone";
import { describeTooth } from "@/lib/domain/tooth";
import { recordAudit } from "@/lib/server/audit";
import { AppError, conflict, notFound } from "@/lib/server/errors";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The contract's body: `{ elementString }` from a scan or typed code, or `{ lot }` typed by hand. */
export const lotBodySchema = z.union(
  [
    z.object({ elementString: z.string().min(1, { message: "Scan or type the code from the block's package." }).max(200) }).strict(),
    z.object({ lot: z.string().min(1, { message: "Type the lot number." }).max(TEXT_LIMITS.lot) }).strict(),
  ],
  { error: "Send either the package code (elementString) or the lot typed by hand (lot)." },
);
export type LotBody = z.infer<typeof lotBodySchema>;

export type RecordedLot = { gtin?: string; lot: string; expiry?: string; serial?: string };

/** Visits in these states can have a block recorded. */
const RECORDABLE = ["confirmed", "checked_in", "in_progress", "completed"];

export async function recordLot(opts: {
  user: SessionUser;
  appointmentId: string;
  body: LotBody;
  ip?: string;
  userAgent?: string;
  now?: Date;
}): Promise<RecordedLot> {
  const { user, body } = opts;
  const visit = UUID.test(opts.appointmentId) ? await Appointment.findByPk(opts.appointmentId) : null;
  if (!visit || visit.clinicId !== user.clinicId) throw notFound("That visit");
  if (!RECORDABLE.includes(visit.status)) throw conflict(`This visit is ${visit.status.replace("_", " ")}, so no block can be recorded on it.`);
  const clinic = (await Clinic.findByPk(visit.clinicId))!;
  const today = localDate(opts.now ?? new Date(), clinic.timeZone);

  let fields: RecordedLot;
  try {
    fields = "elementString" in body ? readBlockCode(body.elementString, today) : { lot: normaliseLot(body.lot) };
  } catch (err) {
    if (err instanceof Gs1Error) throw new AppError(422, err.message, { field: "elementString" in body ? "elementString" : "lot", code: err.code });
    throw err;
  }

  await sequelize.transaction(async (transaction) => {
    const row = await BlockLot.create(
      {
        clinicId: visit.clinicId, appointmentId: visit.id, patientId: visit.patientId,
        gtin: fields.gtin ?? null, lot: fields.lot, expiry: fields.expiry ?? null, serial: fields.serial ?? null,
        elementString: "elementString" in body ? body.elementString : null,
        source: "elementString" in body ? "code" : "typed", recordedBy: user.id,
      },
      { transaction },
    );
    await recordAudit(
      {
        clinicId: visit.clinicId, actorUserId: user.id, action: "visit.lot_recorded", subjectType: "appointment", subjectId: visit.id,
        ip: opts.ip, userAgent: opts.userAgent, data: { blockLotId: row.id, ...fields },
      },
      transaction,
    );
  });
  return {
    ...(fields.gtin ? { gtin: fields.gtin } : {}), lot: fields.lot,
    ...(fields.expiry ? { expiry: fields.expiry } : {}), ...(fields.serial ? { serial: fields.serial } : {}),
  };
}

export type LotRow = {
  id: number;
  lot: string;
  gtin: string | null;
  expiry: string | null;
  serial: string | null;
  source: "code" | "typed";
  recordedAt: Date;
  recordedBy: string | null;
};

function toRow(l: BlockLot, names: Map<string, string>): LotRow {
  return {
    id: Number(l.id), lot: l.lot, gtin: l.gtin, expiry: l.expiry, serial: l.serial, source: l.source,
    recordedAt: l.recordedAt, recordedBy: l.recordedBy ? names.get(l.recordedBy) ?? null : null,
  };
}

async function namesOf(ids: (string | null)[]): Promise<Map<string, string>> {
  const unique = [...new Set(ids.filter((x): x is string => !!x))];
  if (unique.length === 0) return new Map();
  const users = await User.findAll({ where: { id: { [Op.in]: unique } }, attributes: ["id", "name", "email"] });
  return new Map(users.map((u) => [u.id, u.name ?? u.email]));
}

/** The blocks recorded on one visit of the clinic, oldest first (for the visit page, completion and consent records). */
export async function listLotsForVisit({ clinicId, appointmentId }: { clinicId: string; appointmentId: string }): Promise<LotRow[]> {
  const rows = await BlockLot.findAll({ where: { clinicId, appointmentId }, order: [["recordedAt", "ASC"], ["id", "ASC"]] });
  const names = await namesOf(rows.map((r) => r.recordedBy));
  return rows.map((r) => toRow(r, names));
}

export type PatientLotRow = LotRow & { appointmentId: string; visitStart: Date; tooth: string; material: string; mode: string };

/** The blocks a patient received at this clinic, newest first (for the patient record). */
export async function listLotsForPatient({ clinicId, patientId }: { clinicId: string; patientId: string }): Promise<PatientLotRow[]> {
  const rows = await BlockLot.findAll({ where: { clinicId, patientId }, order: [["recordedAt", "DESC"], ["id", "DESC"]] });
  return withVisits(rows);
}

async function withVisits(rows: BlockLot[]): Promise<PatientLotRow[]> {
  const visits = await Appointment.findAll({
    where: { id: { [Op.in]: [...new Set(rows.map((r) => r.appointmentId))] } },
    include: [{ model: Material, as: "material", attributes: ["name"] }],
  });
  const byId = new Map(visits.map((v) => [v.id, v]));
  const names = await namesOf(rows.map((r) => r.recordedBy));
  return rows.map((r) => {
    const v = byId.get(r.appointmentId)!;
    return {
      ...toRow(r, names), appointmentId: v.id, visitStart: v.startsAt, tooth: describeTooth(v.tooth).label,
      material: v.material?.name ?? "", mode: v.mode,
    };
  });
}

export type RecallRow = PatientLotRow & { patientId: string; patientName: string; patientEmail: string; patientPhone: string | null };

/** Who received a lot: exact match, ignoring letter case and surrounding spaces. */
export async function findPatientsByLot({ clinicId, lot }: { clinicId: string; lot: string }): Promise<RecallRow[]> {
  const wanted = lot.trim();
  if (!wanted) return [];
  const rows = await BlockLot.findAll({
    where: { clinicId, [Op.and]: [sequelize.where(sequelize.fn("upper", sequelize.col("lot")), wanted.toUpperCase())] },
    order: [["recordedAt", "DESC"], ["id", "DESC"]],
    limit: 500,
  });
  const detailed = await withVisits(rows);
  const patients = await Patient.findAll({
    where: { id: { [Op.in]: [...new Set(rows.map((r) => r.patientId))] }, clinicId },
    include: [{ model: User, as: "user", attributes: ["name", "email"] }],
  });
  const byId = new Map(patients.map((p) => [p.id, p]));
  return detailed.map((d, i) => {
    const p = byId.get(rows[i].patientId)!;
    return { ...d, patientId: p.id, patientName: p.user?.name ?? p.user?.email ?? "", patientEmail: p.user?.email ?? "", patientPhone: p.phone };
  });
}

/** The clinic's latest recorded blocks, for the lots page. */
export async function listRecentLots({ clinicId, limit = 20 }: { clinicId: string; limit?: number }) {
  const rows = await BlockLot.findAll({ where: { clinicId }, order: [["recordedAt", "DESC"], ["id", "DESC"]], limit });
  return withVisits(rows);
}
