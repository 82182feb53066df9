// Data access for visits (appointments): lists for reception, detail and timeline for everyone allowed.
import "server-only";
import { Op } from "sequelize";
import { Appointment, AppointmentStage, Clinic, Equipment, Material, Patient, Proposal, User } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { searchSlots } from "@/lib/booking/search";
import { findVisitFor } from "@/lib/booking/transitions";
import { stageLabel } from "@/lib/domain/timeline";
import { isoInZone } from "@/lib/domain/time-zone";
import { describeTooth } from "@/lib/domain/tooth";
import type { AppointmentStatus, StageKey } from "@/lib/domain/types";

export async function getVisitTimeline({ user, id }: { user: SessionUser; id: string }) {
  const visit = await findVisitFor({ user }, id);
  const [clinic, stages, material, equipment, dentist] = await Promise.all([
    Clinic.findByPk(visit.clinicId),
    AppointmentStage.findAll({ where: { appointmentId: visit.id }, order: [["seq", "ASC"]] }),
    Material.findByPk(visit.materialId, { include: ["modes"] }),
    Equipment.findAll({ where: { id: [visit.chairId, visit.millId, visit.furnaceId].filter(Boolean) as string[] } }),
    User.findByPk(visit.dentistId, { attributes: ["id", "name"] }),
  ]);
  const zone = clinic!.timeZone;
  const modeRow = material?.modes?.find((m) => m.mode === visit.mode);
  const names: Record<string, { kind: string; id: string; name: string }> = {
    dentist: { kind: "dentist", id: visit.dentistId, name: dentist?.name ?? "Dentist" },
  };
  for (const e of equipment) names[e.kind] = { kind: e.kind, id: e.id, name: e.name };
  return {
    id: visit.id,
    status: visit.status,
    timezone: zone,
    start: isoInZone(visit.startsAt, zone),
    end: isoInZone(visit.endsAt, zone),
    stages: stages.map((s) => ({
      key: s.key,
      label: material && modeRow ? stageLabel(s.key as StageKey, { material, mode: modeRow }) : s.key,
      start: isoInZone(s.actualStart ?? s.plannedStart, zone),
      end: isoInZone(s.actualEnd ?? s.plannedEnd, zone),
      plannedStart: isoInZone(s.plannedStart, zone),
      plannedEnd: isoInZone(s.plannedEnd, zone),
      equipment: s.equipment.map((k) => names[k]).filter(Boolean),
    })),
  };
}

export type VisitRow = Awaited<ReturnType<typeof listVisits>>[number];

export async function listVisits({ user, statuses, from, to }: { user: SessionUser; statuses?: AppointmentStatus[]; from?: Date; to?: Date }) {
  const clinic = await Clinic.findByPk(user.clinicId!);
  const where: Record<string, unknown> = { clinicId: user.clinicId };
  if (statuses?.length) where.status = { [Op.in]: statuses };
  if (from || to) where.startsAt = { ...(from ? { [Op.gte]: from } : {}), ...(to ? { [Op.lt]: to } : {}) };
  const rows = await Appointment.findAll({
    where,
    include: [
      { model: Patient, as: "patient", include: [{ model: User, as: "user", attributes: ["name", "email"] }] },
      { model: Material, as: "material", attributes: ["name"] },
    ],
    order: [["startsAt", "ASC"]],
    limit: 500,
  });
  return rows.map((a) => ({
    id: a.id,
    status: a.status,
    patientName: a.patient?.user?.name ?? "—",
    tooth: describeTooth(a.tooth),
    material: a.material?.name ?? "—",
    mode: a.mode,
    start: a.startsAt,
    end: a.endsAt,
    minutes: Math.round((a.endsAt.getTime() - a.startsAt.getTime()) / 60_000),
    statusReason: a.statusReason,
    zone: clinic!.timeZone,
    proposalId: a.proposalId,
    materialId: a.materialId,
  }));
}

export async function listPatientVisits({ patientId }: { patientId: string }) {
  const rows = await Appointment.findAll({ where: { patientId }, include: [{ model: Material, as: "material", attributes: ["name", "translations"] }], order: [["startsAt", "DESC"]] });
  return rows;
}

/** What a visit page shows: the visit (404 unless the user may see it), its clinic, material and patient. */
export async function getVisitPage({ user, id }: { user: SessionUser; id: string }) {
  const visit = await findVisitFor({ user }, id);
  const [clinic, material, patient] = await Promise.all([
    Clinic.findByPk(visit.clinicId),
    Material.findByPk(visit.materialId),
    Patient.findByPk(visit.patientId, { include: [{ model: User, as: "user", attributes: ["name", "email"] }] }),
  ]);
  return { visit, clinic: clinic!, material, patient };
}

/** Free start times to move a visit to (its own reservations do not count as busy). 404 unless the user may see it. */
export async function findSlotsToMove({ user, id, from, days }: { user: SessionUser; id: string; from?: string; days?: number }) {
  const visit = await findVisitFor({ user }, id);
  const proposal = (await Proposal.findByPk(visit.proposalId))!;
  return searchSlots({ proposal, materialId: visit.materialId, mode: visit.mode, from, days, excludeAppointmentId: visit.id });
}
