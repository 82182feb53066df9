// The day board: every chair, mill and furnace of the clinic for one clinic-local day, the visits
// on them with planned, actual and projected stage times, and the conflicts of the projection.
import "server-only";
import { Op } from "sequelize";
import { Appointment, AppointmentStage, Clinic, Equipment, EquipmentOutage, Material, MaterialMode, OpeningHour, Patient, User, sequelize } from "@/db/models";
import { withDefaults } from "@/lib/domain/clinic-settings";
import { projectDay, type BoardVisitInput, type Conflict, type DeviceKind } from "@/lib/domain/day-board";
import { stageLabel } from "@/lib/domain/timeline";
import { addDays, isoInZone, localDate, localTime, weekdayOf, zonedTime } from "@/lib/domain/time-zone";
import { describeTooth } from "@/lib/domain/tooth";
import type { AppointmentStatus, Mode, ResourceKind, StageKey } from "@/lib/domain/types";
import { badRequest, notFound } from "@/lib/server/errors";

const MIN = 60_000;
const ON_BOARD: AppointmentStatus[] = ["requested", "confirmed", "checked_in", "in_progress", "completed"];
const KIND_ORDER: DeviceKind[] = ["chair", "mill", "furnace"];

export type BoardStage = {
  key: StageKey;
  label: string;
  equipment: ResourceKind[];
  laneIds: string[];
  plannedStart: string;
  plannedEnd: string;
  actualStart: string | null;
  actualEnd: string | null;
  start: string;
  end: string;
  state: "planned" | "running" | "done";
  shiftMinutes: number;
};

export type BoardVisit = {
  id: string;
  status: AppointmentStatus;
  patientId: string;
  initials: string;
  tooth: { fdi: number; label: string };
  material: string;
  mode: Mode;
  dentist: string;
  lanes: { chair: string; mill: string; furnace: string | null };
  plannedStart: string;
  plannedEnd: string;
  projectedEnd: string;
  delayMinutes: number;
  /** The crown block: VITA classical shade, size, and when it was loaded into the mill. */
  block: { shade: string | null; size: string | null; loadedAt: string | null };
  stages: BoardStage[];
};

export type BoardConflict = {
  visitId: string;
  stageKey: StageKey;
  stageLabel: string;
  resourceKind: ResourceKind;
  resourceId: string;
  resourceName: string;
  blockedByVisitId: string | null;
  wantedStart: string;
  laterStart: string;
  waitMinutes: number;
  switchTo: { laneId: string; name: string; start: string } | null;
  message: string;
  proposal: string;
};

export type Board = {
  day: string;
  timezone: string;
  isToday: boolean;
  generatedAt: string;
  window: { start: string; end: string };
  lanes: { id: string; kind: DeviceKind; name: string; active: boolean; outages: { id: number; start: string; end: string; reason: string | null }[] }[];
  visits: BoardVisit[];
  conflicts: BoardConflict[];
};

export function initialsOf(name: string | null | undefined): string {
  const parts = (name ?? "").trim().split(/[\s-]+/).filter(Boolean);
  return parts.map((p) => p[0]!.toUpperCase()).join("").slice(0, 3) || "?";
}

export function parseDay(day: string | null | undefined, zone: string, now: Date): string {
  if (!day) return localDate(now, zone);
  if (!/^\d{4}-\d{2}-\d{2}$/.test(day) || Number.isNaN(Date.parse(`${day}T12:00:00Z`)) || new Date(`${day}T12:00:00Z`).toISOString().slice(0, 10) !== day) {
    throw badRequest("The day must be a date written YYYY-MM-DD.", "day");
  }
  return day;
}

type Range = [{ value: Date }, { value: Date }] | [Date, Date];
export function rangeOf(during: Range): { start: Date; end: Date } {
  const [a, b] = during as [Date | { value: Date }, Date | { value: Date }];
  const v = (x: Date | { value: Date }) => (x instanceof Date ? x : new Date(x.value));
  return { start: v(a), end: v(b) };
}

export async function loadBoard({ clinicId, day: wanted, now = new Date() }: { clinicId: string; day?: string | null; now?: Date }): Promise<Board> {
  const clinic = await Clinic.findByPk(clinicId);
  if (!clinic) throw notFound("That clinic");
  const zone = clinic.timeZone;
  const day = parseDay(wanted, zone, now);
  const dayStart = zonedTime(day, "00:00", zone);
  const dayEnd = zonedTime(addDays(day, 1), "00:00", zone);
  const isToday = localDate(now, zone) === day;

  // One range overlap (the GiST index of migration 0017 and its statistics), not two comparisons whose
  // selectivities multiply; stages and materials by one query each rather than joined in, so each
  // visit's row is not repeated per stage and per material mode.
  const dayRange = `tstzrange(${sequelize.escape(dayStart.toISOString())}, ${sequelize.escape(dayEnd.toISOString())})`;
  const visits = await Appointment.findAll({
    where: {
      clinicId,
      status: { [Op.in]: ON_BOARD },
      [Op.and]: [sequelize.literal(`tstzrange("appointment"."starts_at", "appointment"."ends_at") && ${dayRange}`)],
    },
    include: [{ model: Patient, as: "patient", attributes: ["id", "userId"], include: [{ model: User, as: "user", attributes: ["name"] }] }],
    order: [["startsAt", "ASC"], ["id", "ASC"]],
  });
  const ids = visits.map((v) => v.id);
  const stageRows = ids.length ? await AppointmentStage.findAll({ where: { appointmentId: { [Op.in]: ids } }, order: [["appointmentId", "ASC"], ["seq", "ASC"]] }) : [];
  const stagesOf = new Map<string, AppointmentStage[]>();
  for (const s of stageRows) stagesOf.set(s.appointmentId, [...(stagesOf.get(s.appointmentId) ?? []), s]);
  const materialIds = [...new Set(visits.map((v) => v.materialId))];
  const materials = materialIds.length
    ? await Material.findAll({ where: { id: { [Op.in]: materialIds } }, include: [{ model: MaterialMode, as: "modes" }] })
    : [];
  const materialOf = new Map(materials.map((m) => [m.id, m]));
  const equipment = await Equipment.findAll({ where: { clinicId }, order: [["name", "ASC"]] });
  const used = new Set(visits.flatMap((v) => [v.chairId, v.millId, v.furnaceId]));
  const lanesEq = equipment
    .filter((e) => e.active || used.has(e.id))
    .sort((a, b) => KIND_ORDER.indexOf(a.kind) - KIND_ORDER.indexOf(b.kind) || a.name.localeCompare(b.name, "en", { numeric: true }));
  const outages = await EquipmentOutage.findAll({
    where: { equipmentId: { [Op.in]: lanesEq.map((e) => e.id) }, during: { [Op.overlap]: [dayStart, dayEnd] } },
    order: [["id", "ASC"]],
  });
  const dentists = await User.findAll({ where: { id: { [Op.in]: [...new Set(visits.map((v) => v.dentistId))] } }, attributes: ["id", "name"] });
  const dentistName = new Map(dentists.map((d) => [d.id, d.name ?? "Dentist"]));
  const settings = withDefaults(clinic.settings);

  const inputs: BoardVisitInput[] = visits.map((v) => ({
    id: v.id,
    status: v.status,
    dentistId: v.dentistId,
    devices: { chair: v.chairId, mill: v.millId, furnace: v.furnaceId },
    stages: (stagesOf.get(v.id) ?? []).map((s) => ({
      key: s.key as StageKey,
      equipment: s.equipment,
      plannedStart: s.plannedStart.getTime(),
      plannedEnd: s.plannedEnd.getTime(),
      actualStart: s.actualStart?.getTime() ?? null,
      actualEnd: s.actualEnd?.getTime() ?? null,
    })),
  }));
  const projection = projectDay({
    devices: equipment.filter((e) => e.active).map((e) => ({ id: e.id, kind: e.kind, name: e.name })),
    outages: outages.map((o) => ({ equipmentId: o.equipmentId, ...msRange(o.during) })),
    visits: inputs,
    // Only today has a present; a past day's unfinished stages keep their recorded or planned times.
    now: isToday ? now.getTime() : undefined,
    bufferMinutes: settings.bufferMinutes,
  });

  // Stage edges repeat (one stage's end is the next one's start; most projections equal the plan).
  const isoCache = new Map<number, string>();
  const iso = (at: number | Date) => {
    const key = typeof at === "number" ? at : at.getTime();
    let text = isoCache.get(key);
    if (text === undefined) isoCache.set(key, (text = isoInZone(new Date(key), zone)));
    return text;
  };
  const projected = new Map(projection.visits.map((x) => [x.id, x]));
  const boardVisits: BoardVisit[] = visits.map((v) => {
    const p = projected.get(v.id)!;
    const material = materialOf.get(v.materialId);
    const modeRow = material?.modes?.find((m) => m.mode === v.mode);
    const label = (key: StageKey) => (material && modeRow ? stageLabel(key, { material, mode: modeRow }) : stageLabel(key));
    return {
      id: v.id,
      status: v.status,
      patientId: v.patientId,
      initials: initialsOf(v.patient?.user?.name),
      tooth: { fdi: v.tooth, label: describeTooth(v.tooth).label },
      material: material?.name ?? "",
      mode: v.mode,
      dentist: dentistName.get(v.dentistId) ?? "Dentist",
      lanes: { chair: v.chairId, mill: v.millId, furnace: v.furnaceId },
      plannedStart: iso(v.startsAt),
      plannedEnd: iso(p.plannedEnd),
      projectedEnd: iso(p.projectedEnd),
      delayMinutes: p.delayMinutes,
      block: { shade: v.shade ?? null, size: v.blockSize ?? null, loadedAt: v.blockLoadedAt ? iso(v.blockLoadedAt) : null },
      stages: p.stages.map((s) => ({
        key: s.key,
        label: label(s.key),
        equipment: [...s.equipment],
        laneIds: s.equipment.filter((k): k is DeviceKind => k !== "dentist").map((k) => v[`${k}Id` as "chairId"]).filter((x): x is string => !!x),
        plannedStart: iso(s.plannedStart),
        plannedEnd: iso(s.plannedEnd),
        actualStart: s.actualStart === null ? null : iso(s.actualStart),
        actualEnd: s.actualEnd === null ? null : iso(s.actualEnd),
        start: iso(s.start),
        end: iso(s.end),
        state: s.state,
        shiftMinutes: s.shiftMinutes,
      })),
    };
  });

  const byId = new Map(boardVisits.map((v) => [v.id, v]));
  const names = new Map(equipment.map((e) => [e.id, e.name]));
  const conflicts = projection.conflicts.map((c) => describeConflict(c, byId, names, dentistName, zone));

  // Draw from opening time (or the first visit) to closing time (or the last projected end).
  const hours = await OpeningHour.findAll({ where: { clinicId, weekday: weekdayOf(day) } });
  const edges = [
    ...hours.flatMap((h) => [zonedTime(day, h.opens, zone).getTime(), zonedTime(day, h.closes, zone).getTime()]),
    ...projection.visits.flatMap((v) => [Math.min(...v.stages.map((s) => s.start)), v.projectedEnd]),
  ];
  const start = edges.length ? Math.max(dayStart.getTime(), Math.floor(Math.min(...edges) / (30 * MIN)) * 30 * MIN) : zonedTime(day, "08:00", zone).getTime();
  const end = edges.length ? Math.min(dayEnd.getTime(), Math.ceil(Math.max(...edges) / (30 * MIN)) * 30 * MIN) : zonedTime(day, "18:00", zone).getTime();

  return {
    day,
    timezone: zone,
    isToday,
    generatedAt: iso(now),
    window: { start: iso(start), end: iso(end) },
    lanes: lanesEq.map((e) => ({
      id: e.id, kind: e.kind, name: e.name, active: e.active,
      outages: outages.filter((o) => o.equipmentId === e.id).map((o) => {
        const r = rangeOf(o.during);
        return { id: Number(o.id), start: iso(r.start), end: iso(r.end), reason: o.reason };
      }),
    })),
    visits: boardVisits,
    conflicts,
  };
}

function msRange(during: Range) {
  const r = rangeOf(during);
  return { start: r.start.getTime(), end: r.end.getTime() };
}

function describeConflict(c: Conflict, visits: Map<string, BoardVisit>, names: Map<string, string>, dentists: Map<string, string>, zone: string): BoardConflict {
  const v = visits.get(c.visitId)!;
  const stage = v.stages.find((s) => s.key === c.stageKey)!;
  const resourceName = c.resourceKind === "dentist" ? dentists.get(c.resourceId) ?? "The dentist" : names.get(c.resourceId) ?? c.resourceKind;
  const t = (ms: number) => localTime(new Date(ms), zone);
  const wait = Math.round((c.laterStart - c.wantedStart) / MIN);
  let cause: string;
  if (c.blockedBy.type === "outage") cause = `${resourceName} is out of service`;
  else {
    const other = visits.get(c.blockedBy.visitId);
    const otherStage = other?.stages.find((s) => s.key === (c.blockedBy as { stageKey: StageKey }).stageKey);
    cause = `${resourceName} is busy with ${other ? `${other.initials}'s ${otherStage?.label.toLowerCase() ?? "visit"}` : "another visit"}`;
  }
  const message = `${v.initials} (tooth ${v.tooth.fdi}): ${stage.label.toLowerCase()} would start at ${t(c.wantedStart)}, but ${cause}.`;
  const later = `start at ${t(c.laterStart)} on ${resourceName} (${wait} min later)`;
  const proposal = c.switchTo
    ? `Use ${names.get(c.switchTo.deviceId)} from ${t(c.switchTo.start)}, or ${later}.`
    : `${later[0].toUpperCase()}${later.slice(1)}.`;
  return {
    visitId: c.visitId,
    stageKey: c.stageKey,
    stageLabel: stage.label,
    resourceKind: c.resourceKind,
    resourceId: c.resourceId,
    resourceName,
    blockedByVisitId: c.blockedBy.type === "visit" ? c.blockedBy.visitId : null,
    wantedStart: isoInZone(new Date(c.wantedStart), zone),
    laterStart: isoInZone(new Date(c.laterStart), zone),
    waitMinutes: wait,
    switchTo: c.switchTo ? { laneId: c.switchTo.deviceId, name: names.get(c.switchTo.deviceId) ?? "", start: isoInZone(new Date(c.switchTo.start), zone) } : null,
    message,
    proposal,
  };
}
