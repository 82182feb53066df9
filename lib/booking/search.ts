// Availability for a proposal's chosen material and mode, from today (clinic time) or a given day.
import type { Transaction } from "sequelize";
import type { Proposal } from "@/db/models";
import { findSlots, type Slot } from "@/lib/domain/availability";
import { DEFAULT_SEARCH_DAYS } from "@/lib/domain/clinic-settings";
import { addDays, localDate, zonedTime } from "@/lib/domain/time-zone";
import type { Mode } from "@/lib/domain/types";
import { notFound } from "@/lib/server/errors";
import { loadBusy, loadResources, loadRules, loadTimeline, readClinic } from "./context";

export async function searchSlots(opts: {
  proposal: Pick<Proposal, "clinicId" | "dentistId" | "tooth">;
  materialId: string;
  mode: Mode;
  from?: string;
  days?: number;
  now?: Date;
  excludeAppointmentId?: string;
  transaction?: Transaction;
}): Promise<{ timezone: string; slots: Slot[]; totalMinutes: number }> {
  const { proposal, transaction } = opts;
  const clinic = await readClinic(proposal.clinicId, transaction);
  if (!clinic) throw notFound("That clinic");
  const now = opts.now ?? new Date();
  const today = localDate(now, clinic.timeZone);
  const from = opts.from && opts.from > today ? opts.from : today;
  const days = opts.days ?? DEFAULT_SEARCH_DAYS;
  const [rules, { timeline, furnaceIds }, allResources] = await Promise.all([
    loadRules(clinic, transaction),
    loadTimeline({ clinicId: clinic.id, clinic, materialId: opts.materialId, mode: opts.mode, tooth: proposal.tooth, transaction }),
    loadResources(clinic, proposal.dentistId, transaction),
  ]);
  // Only furnaces able to run the visit's firing programmes.
  const resources = furnaceIds ? { ...allResources, furnace: allResources.furnace.filter((id) => furnaceIds.includes(id)) } : allResources;
  const busy = await loadBusy({
    clinicId: clinic.id,
    resources,
    from: zonedTime(from, "00:00", clinic.timeZone),
    to: zonedTime(addDays(from, days + 1), "00:00", clinic.timeZone),
    excludeAppointmentId: opts.excludeAppointmentId,
    transaction,
  });
  return { timezone: clinic.timeZone, slots: findSlots({ timeline, rules, resources, busy, from, days, now }), totalMinutes: timeline.totalMinutes };
}
