// Loads what the pure timeline and availability functions need, from the database.
//
// A clinic's scheduling settings (opening hours, closed days, working equipment, stage minutes,
// materials and their modes, furnace programmes) change rarely and every search reads them, so
// they are kept in memory per clinic under the clinic's `settings_version`. Database triggers bump
// that version in the same transaction as every write to those tables (migration 0016); each use
// reads the clinic row and its version first, so a copy is used only while it is current, whichever
// app instance made the change. What a transaction reads is never kept (it may be its own,
// uncommitted change).
import { QueryTypes, type Attributes, type Transaction } from "sequelize";
import { FurnaceProgramme, Material, MaterialMode, sequelize } from "@/db/models";
import { selectRows } from "@/db/select-rows";
import type { ClinicSettingsJson } from "@/db/models/clinic";
import { capableFurnaces, ProgrammeUnavailable, withProgrammeMinutes, type FurnaceProgrammeRow } from "@/lib/domain/furnace-programmes";
import { BusyIndex, type AvailabilityRules, type Resources } from "@/lib/domain/availability";
import { withDefaults } from "@/lib/domain/clinic-settings";
import { estimateTimeline, TimelineError, type Timeline } from "@/lib/domain/timeline";
import { fromFdi } from "@/lib/domain/tooth";
import type { Mode } from "@/lib/domain/types";
import { AppError, notFound, unprocessable } from "@/lib/server/errors";

export type ClinicRow = { id: string; timeZone: string; settings: ClinicSettingsJson; settingsVersion?: string };

type MaterialRow = Attributes<Material>;
type ModeRow = Attributes<MaterialMode>;

/** A clinic's scheduling settings, as plain rows. */
type SchedulingSettings = {
  hours: { weekday: number; opens: string; closes: string }[];
  closedDays: string[];
  /** Working equipment, by name. */
  equipment: { id: string; kind: string }[];
  stageMinutes: { stage: string; toothClass: string | null; minutes: number }[];
  materials: Map<string, MaterialRow>;
  /** By `${materialId} ${mode}`. */
  modes: Map<string, ModeRow>;
  programmes: Map<string, FurnaceProgrammeRow>;
};

const MAX_CACHED_CLINICS = 500;
const cached = new Map<string, { version: bigint; settings: Promise<SchedulingSettings> }>();

/** The clinic's row with its settings version: one primary-key read on every use. */
export async function readClinic(clinicId: string, transaction?: Transaction): Promise<ClinicRow | null> {
  const [row] = await selectRows<ClinicRow>(
    `SELECT id, time_zone AS "timeZone", settings, settings_version::text AS "settingsVersion" FROM clinics WHERE id = $1`,
    [clinicId],
    transaction,
  );
  return row ?? null;
}

async function fetchSettings(clinicId: string, transaction?: Transaction): Promise<SchedulingSettings> {
  const q = <T extends object>(sql: string) => sequelize.query<T>(sql, { replacements: { clinicId }, type: QueryTypes.SELECT, transaction });
  // One after another: a transaction has one connection, and a miss is rare enough.
  const hours = await q<SchedulingSettings["hours"][number]>(`SELECT weekday, opens::text, closes::text FROM opening_hours WHERE clinic_id = :clinicId`);
  const closed = await q<{ day: string }>(`SELECT day::text AS day FROM closed_days WHERE clinic_id = :clinicId`);
  const equipment = await q<SchedulingSettings["equipment"][number]>(`SELECT id, kind FROM equipment WHERE clinic_id = :clinicId AND active ORDER BY name`);
  const stageMinutes = await q<SchedulingSettings["stageMinutes"][number]>(`SELECT stage, tooth_class AS "toothClass", minutes FROM stage_durations WHERE clinic_id = :clinicId`);
  const materials = await Material.findAll({ where: { clinicId }, raw: true, transaction });
  const modes = await MaterialMode.findAll({ include: [{ model: Material, as: "material", attributes: [], where: { clinicId }, required: true }], raw: true, transaction });
  const programmes = await FurnaceProgramme.findAll({ where: { clinicId }, raw: true, transaction });
  return {
    hours: hours.map((h) => ({ weekday: h.weekday, opens: h.opens.slice(0, 5), closes: h.closes.slice(0, 5) })),
    closedDays: closed.map((c) => c.day),
    equipment,
    stageMinutes,
    materials: new Map(materials.map((m) => [m.id, m as MaterialRow])),
    modes: new Map(modes.map((m) => [`${m.materialId} ${m.mode}`, m as ModeRow])),
    programmes: new Map(programmes.map((p) => [p.id, p as FurnaceProgrammeRow])),
  };
}

/** The clinic's scheduling settings, from memory while its settings version has not moved. */
async function settingsOf(clinic: ClinicRow, transaction?: Transaction): Promise<SchedulingSettings> {
  if (clinic.settingsVersion === undefined) return fetchSettings(clinic.id, transaction);
  const version = BigInt(clinic.settingsVersion);
  const hit = cached.get(clinic.id);
  if (hit && hit.version === version) return hit.settings;
  // A transaction may see its own, uncommitted settings: used, never kept. (A copy kept from
  // committed data can serve it: a transaction that wrote settings holds a version no one else has.)
  if (transaction) return fetchSettings(clinic.id, transaction);
  // Read after the version, so what is stored is at least as new as the version it is filed under.
  const settings = fetchSettings(clinic.id);
  if (!hit || hit.version < version) {
    if (!hit && cached.size >= MAX_CACHED_CLINICS) cached.delete(cached.keys().next().value!);
    cached.set(clinic.id, { version, settings });
    settings.catch(() => {
      if (cached.get(clinic.id)?.settings === settings) cached.delete(clinic.id);
    });
  }
  return settings;
}

async function clinicOrFail(clinicId: string, transaction?: Transaction): Promise<ClinicRow> {
  const clinic = await readClinic(clinicId, transaction);
  if (!clinic) throw notFound("That clinic");
  return clinic;
}

export async function loadRules(clinic: ClinicRow, transaction?: Transaction): Promise<AvailabilityRules> {
  const { hours, closedDays } = await settingsOf(clinic, transaction);
  const settings = withDefaults(clinic.settings);
  return {
    zone: clinic.timeZone,
    openingHours: hours,
    closedDays,
    slotMinutes: settings.slotMinutes,
    bufferMinutes: settings.bufferMinutes,
    minNoticeMinutes: settings.minNoticeMinutes,
  };
}

/** The visit's timeline, with firing minutes from the assigned furnace programmes, and the furnaces
 *  able to run them (null: any furnace). A mode whose programme no working furnace runs is a 422. */
export async function loadTimeline(opts: { clinicId: string; clinic?: ClinicRow; materialId: string; mode: Mode; tooth: number; transaction?: Transaction }): Promise<{ timeline: Timeline; material: MaterialRow; materialMode: ModeRow; furnaceIds: string[] | null }> {
  const clinic = opts.clinic ?? (await clinicOrFail(opts.clinicId, opts.transaction));
  const settings = await settingsOf(clinic, opts.transaction);
  const material = settings.materials.get(opts.materialId);
  if (!material) throw notFound("That material");
  const materialMode = settings.modes.get(`${material.id} ${opts.mode}`);
  if (!materialMode) throw unprocessable(`${material.name} cannot be made in the ${opts.mode} mode at this clinic.`, "mode");
  const row = (id: string | null): FurnaceProgrammeRow | null => (id && settings.programmes.get(id)) || null;
  const choice = { heat: material.heatTreatment === "none" ? null : row(materialMode.heatProgrammeId), glaze: materialMode.finishing === "stain_glaze" ? row(materialMode.glazeProgrammeId) : null };
  try {
    const timeline = estimateTimeline({
      material,
      mode: withProgrammeMinutes(materialMode, choice),
      toothClass: fromFdi(opts.tooth).toothClass,
      stageMinutes: settings.stageMinutes as Parameters<typeof estimateTimeline>[0]["stageMinutes"],
    });
    let furnaceIds: string[] | null = null;
    if (choice.heat || choice.glaze) {
      const working = settings.equipment.filter((e) => e.kind === "furnace");
      // Only the firings this visit really has count (a polished finish has no glaze firing).
      const fires = new Set(timeline.stages.map((s) => s.key));
      furnaceIds = capableFurnaces(working.map((f) => f.id), [fires.has("heat_treatment") ? choice.heat : null, fires.has("glaze_firing") ? choice.glaze : null]);
    }
    return { timeline, material, materialMode, furnaceIds };
  } catch (err) {
    if (err instanceof TimelineError || err instanceof ProgrammeUnavailable) throw new AppError(422, err.message, { field: "mode", code: "mode_unavailable" });
    throw err;
  }
}

export async function loadResources(clinic: ClinicRow | string, dentistId: string, transaction?: Transaction): Promise<Resources> {
  const { equipment } = await settingsOf(typeof clinic === "string" ? await clinicOrFail(clinic, transaction) : clinic, transaction);
  const ids = (kind: string) => equipment.filter((e) => e.kind === kind).map((e) => e.id);
  return { chair: ids("chair"), mill: ids("mill"), furnace: ids("furnace"), dentist: [dentistId] };
}

/** Active reservations and out-of-service ranges of the clinic's resources between two instants,
 *  read as plain numbers (thousands of rows on a busy fortnight: no model instances, no range parsing). */
export async function loadBusy(opts: { clinicId: string; resources: Resources; from: Date; to: Date; excludeAppointmentId?: string; transaction?: Transaction }): Promise<BusyIndex> {
  const ids = Object.values(opts.resources).flat();
  if (!ids.length) return new BusyIndex([]);
  const values = [ids, opts.from, opts.to, opts.excludeAppointmentId ?? null];
  // Milliseconds since 1970; an open end is null (unbounded).
  const ends = `extract(epoch FROM lower(during)) * 1000 AS start, extract(epoch FROM upper(during)) * 1000 AS "end"`;
  type Row = { resourceId: string; start: number | string | null; end: number | string | null };
  const rows = await selectRows<Row>(
    `SELECT resource_id AS "resourceId", ${ends} FROM reservations
      WHERE resource_id = ANY($1::uuid[]) AND active AND during && tstzrange($2, $3)
        AND ($4::uuid IS NULL OR appointment_id IS DISTINCT FROM $4::uuid)
     UNION ALL
     SELECT equipment_id, ${ends} FROM equipment_outages
      WHERE equipment_id = ANY($1::uuid[]) AND during && tstzrange($2, $3)`,
    values,
    opts.transaction,
  );
  return new BusyIndex(rows.map((r) => ({
    resourceId: r.resourceId,
    start: r.start === null ? -Infinity : Number(r.start),
    end: r.end === null ? Infinity : Number(r.end),
  })));
}
