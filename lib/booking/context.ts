// Loads what the pure timeline and availability functions need, from the database.
import { Op, type Transaction } from "sequelize";
import { ClosedDay, Clinic, Equipment, EquipmentOutage, FurnaceProgramme, Material, MaterialMode, OpeningHour, Reservation, StageDuration } from "@/db/models";
import { capableFurnaces, ProgrammeUnavailable, withProgrammeMinutes, type FurnaceProgrammeRow } from "@/lib/domain/furnace-programmes";
import { BusyIndex, type AvailabilityRules, type Resources } from "@/lib/domain/availability";
import { withDefaults } from "@/lib/domain/clinic-settings";
import { estimateTimeline, TimelineError, type Timeline } from "@/lib/domain/timeline";
import { fromFdi } from "@/lib/domain/tooth";
import type { Mode } from "@/lib/domain/types";
import { AppError, notFound, unprocessable } from "@/lib/server/errors";

export async function loadRules(clinic: Clinic, transaction?: Transaction): Promise<AvailabilityRules> {
  const [hours, closed] = await Promise.all([
    OpeningHour.findAll({ where: { clinicId: clinic.id }, transaction }),
    ClosedDay.findAll({ where: { clinicId: clinic.id }, transaction }),
  ]);
  const settings = withDefaults(clinic.settings);
  return {
    zone: clinic.timeZone,
    openingHours: hours.map((h) => ({ weekday: h.weekday, opens: h.opens.slice(0, 5), closes: h.closes.slice(0, 5) })),
    closedDays: closed.map((c) => c.day),
    slotMinutes: settings.slotMinutes,
    bufferMinutes: settings.bufferMinutes,
    minNoticeMinutes: settings.minNoticeMinutes,
  };
}

/** The visit's timeline, with firing minutes from the assigned furnace programmes, and the furnaces
 *  able to run them (null: any furnace). A mode whose programme no working furnace runs is a 422. */
export async function loadTimeline(opts: { clinicId: string; materialId: string; mode: Mode; tooth: number; transaction?: Transaction }): Promise<{ timeline: Timeline; material: Material; materialMode: MaterialMode; furnaceIds: string[] | null }> {
  const material = await Material.findOne({ where: { id: opts.materialId, clinicId: opts.clinicId }, transaction: opts.transaction });
  if (!material) throw notFound("That material");
  const materialMode = await MaterialMode.findOne({ where: { materialId: material.id, mode: opts.mode }, transaction: opts.transaction });
  if (!materialMode) throw unprocessable(`${material.name} cannot be made in the ${opts.mode} mode at this clinic.`, "mode");
  const stageMinutes = await StageDuration.findAll({ where: { clinicId: opts.clinicId }, transaction: opts.transaction });
  const programmeIds = [materialMode.heatProgrammeId, materialMode.glazeProgrammeId].filter((x): x is string => !!x);
  const programmes = programmeIds.length ? await FurnaceProgramme.findAll({ where: { id: { [Op.in]: programmeIds }, clinicId: opts.clinicId }, transaction: opts.transaction }) : [];
  const row = (id: string | null): FurnaceProgrammeRow | null => programmes.find((p) => p.id === id) ?? null;
  const choice = { heat: material.heatTreatment === "none" ? null : row(materialMode.heatProgrammeId), glaze: materialMode.finishing === "stain_glaze" ? row(materialMode.glazeProgrammeId) : null };
  try {
    const timeline = estimateTimeline({
      material,
      mode: withProgrammeMinutes(materialMode.get({ plain: true }), choice),
      toothClass: fromFdi(opts.tooth).toothClass,
      stageMinutes: stageMinutes.map((s) => ({ stage: s.stage, toothClass: s.toothClass, minutes: s.minutes })),
    });
    let furnaceIds: string[] | null = null;
    if (choice.heat || choice.glaze) {
      const working = await Equipment.findAll({ where: { clinicId: opts.clinicId, kind: "furnace", active: true }, order: [["name", "ASC"]], transaction: opts.transaction });
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

export async function loadResources(clinicId: string, dentistId: string, transaction?: Transaction): Promise<Resources> {
  const equipment = await Equipment.findAll({ where: { clinicId, active: true }, order: [["name", "ASC"]], transaction });
  const ids = (kind: string) => equipment.filter((e) => e.kind === kind).map((e) => e.id);
  return { chair: ids("chair"), mill: ids("mill"), furnace: ids("furnace"), dentist: [dentistId] };
}

/** Active reservations and out-of-service ranges of the clinic's resources between two instants. */
export async function loadBusy(opts: { clinicId: string; resources: Resources; from: Date; to: Date; excludeAppointmentId?: string; transaction?: Transaction }): Promise<BusyIndex> {
  const ids = Object.values(opts.resources).flat();
  const range = [opts.from, opts.to];
  const [reservations, outages] = await Promise.all([
    Reservation.findAll({
      where: {
        resourceId: { [Op.in]: ids },
        active: true,
        during: { [Op.overlap]: range },
        ...(opts.excludeAppointmentId ? { appointmentId: { [Op.ne]: opts.excludeAppointmentId } } : {}),
      } as never,
      transaction: opts.transaction,
    }),
    EquipmentOutage.findAll({ where: { equipmentId: { [Op.in]: ids }, during: { [Op.overlap]: range } } as never, transaction: opts.transaction }),
  ]);
  const toInterval = (during: unknown) => {
    const [a, b] = during as [{ value: Date | string | null }, { value: Date | string | null }];
    return { start: a.value ? new Date(a.value).getTime() : -Infinity, end: b.value ? new Date(b.value).getTime() : Infinity };
  };
  return new BusyIndex([
    ...reservations.map((r) => ({ resourceId: r.resourceId, ...toInterval(r.during) })),
    ...outages.map((o) => ({ resourceId: o.equipmentId, ...toInterval(o.during) })),
  ]);
}
