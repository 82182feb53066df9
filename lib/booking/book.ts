// Booking a visit: one appointment, its planned stages and one reservation per resource per stage
// window, all in one transaction. PostgreSQL's exclusion constraint on reservations is the final
// guard against double booking: of two concurrent requests for the same resources, one fails.
import { UniqueConstraintError, ExclusionConstraintError, type Transaction } from "sequelize";
import { Appointment, AppointmentStage, Clinic, Patient, Proposal, Reservation, sequelize } from "@/db/models";
import { selectRows } from "@/db/select-rows";
import { allowedOption, getBookableProposal } from "@/lib/data/proposals";
import type { SessionUser } from "@/lib/auth/session";
import { assign, holdsFor, isCandidateStart, nearest, type AvailabilityRules } from "@/lib/domain/availability";
import type { Timeline } from "@/lib/domain/timeline";
import { addDays, isoInZone, localDate } from "@/lib/domain/time-zone";
import { fromFdi } from "@/lib/domain/tooth";
import { ACTIVE_STATUSES, type Mode } from "@/lib/domain/types";
import { askDeposit } from "@/lib/payments/deposits";
import { recordAudit } from "@/lib/server/audit";
import { AppError, badRequest, conflict, notFound } from "@/lib/server/errors";
import { loadBusy, loadResources, loadRules, loadTimeline, readClinic } from "./context";
import { sharedAlternatives, type Alternative } from "./alternatives";
import { writeSchedule } from "./schedule";
import { searchSlots } from "./search";
import "@/lib/mail/hooks";

const MIN = 60_000;
const ATTEMPTS = 3;

export type Actor = { user: SessionUser; ip?: string; userAgent?: string };

class SlotTaken extends Error {}

/** Finds free resources for `start` inside the transaction, or throws SlotTaken / a 4xx. */
/** Refuses past, off-grid and out-of-hours starts with a 400 before anything else is looked at. */
function assertBookableTime(rules: AvailabilityRules, timeline: Timeline, start: Date, now: Date) {
  if (start.getTime() <= now.getTime()) throw badRequest("That time has already passed. Pick a time in the future.", "start");
  if (!isCandidateStart(rules, timeline.totalMinutes, start, now)) {
    throw badRequest(
      `That is not a bookable start time: visits start on the ${rules.slotMinutes}-minute grid, inside opening hours, at least ${Math.round(rules.minNoticeMinutes / 60)} hours ahead, and must end before closing.`,
      "start",
    );
  }
}

async function placeAt(opts: { clinic: { id: string }; proposal: Pick<Proposal, "dentistId">; timeline: Timeline; furnaceIds: string[] | null; start: Date; now: Date; excludeAppointmentId?: string; transaction: Transaction }) {
  const setup = (await readClinic(opts.clinic.id, opts.transaction))!;
  const rules = await loadRules(setup, opts.transaction);
  assertBookableTime(rules, opts.timeline, opts.start, opts.now);
  const all = await loadResources(setup, opts.proposal.dentistId, opts.transaction);
  // Only furnaces able to run the visit's firing programmes.
  const resources = opts.furnaceIds ? { ...all, furnace: all.furnace.filter((id) => opts.furnaceIds!.includes(id)) } : all;
  // Everything else was read first: the clinic's turn is held for as short a time as possible.
  await takeScheduleTurn(opts.clinic.id, opts.transaction);
  const busy = await loadBusy({
    clinicId: opts.clinic.id,
    resources,
    from: new Date(opts.start.getTime() - 60 * MIN),
    to: new Date(opts.start.getTime() + (opts.timeline.totalMinutes + 120) * MIN),
    excludeAppointmentId: opts.excludeAppointmentId,
    transaction: opts.transaction,
  });
  const assignment = assign(holdsFor(opts.timeline, opts.start.getTime(), rules.bufferMinutes), resources, busy);
  if (!assignment) throw new SlotTaken();
  return { assignment, rules };
}

type AlternativesQuestion = { proposal: Pick<Proposal, "clinicId" | "dentistId" | "tooth">; materialId: string; mode: Mode; wanted: Date; zone: string; now: Date; excludeAppointmentId?: string };

function alternativesKey(q: AlternativesQuestion) {
  return [q.proposal.clinicId, q.proposal.dentistId, q.materialId, q.mode, fromFdi(q.proposal.tooth).toothClass, q.wanted.toISOString(), q.excludeAppointmentId ?? ""].join(" ");
}

function computeAlternatives(q: AlternativesQuestion) {
  return async (transaction: Transaction) => {
    const day = localDate(q.wanted, q.zone);
    const { slots } = await searchSlots({ proposal: q.proposal, materialId: q.materialId, mode: q.mode, from: addDays(day, -3), days: 7, now: q.now, excludeAppointmentId: q.excludeAppointmentId, transaction });
    return nearest(slots, q.wanted, 3).map((s) => ({ start: isoInZone(s.start, q.zone), end: isoInZone(s.end, q.zone) }));
  };
}

/** The nearest free times to `wanted`, shared by every request that lost the same race. */
async function alternatives(q: AlternativesQuestion) {
  return sharedAlternatives(alternativesKey(q), computeAlternatives(q));
}

const slotTaken = (alternatives: Alternative[]) =>
  new AppError(409, "That time was just taken. Here are the nearest free times.", { code: "slot_taken", extra: { alternatives } });

/**
 * Bookings and moves at one clinic take turns: each waits for the clinic's schedule lock (held until
 * its transaction ends; taking it twice in one transaction does not wait) before reading what is busy. Of fifty patients asking for the same time, the
 * first books and the others then see the time taken at once and are offered the nearest free
 * times, instead of all writing a visit, colliding on the exclusion constraint and retrying. The
 * constraint stays the guarantee; the lock only saves the losers' work. A clinic books a few visits
 * an hour, and each turn lasts milliseconds, so the wait is short.
 */
async function takeScheduleTurn(clinicId: string, transaction: Transaction) {
  await selectRows(`SELECT pg_advisory_xact_lock(hashtextextended($1, 0))`, [`schedule ${clinicId}`], transaction);
}

// Lost races between concurrent bookings: an overlapping reservation (23P01), or PostgreSQL
// breaking a deadlock between two inserts into the same exclusion index (40P01) or a serialisation
// failure (40001). All are retried with fresh data, then answered with 409 and alternatives.
const RACE_CODES = new Set(["23P01", "40P01", "40001"]);

function isRaceLoss(err: unknown) {
  return err instanceof SlotTaken || err instanceof ExclusionConstraintError || RACE_CODES.has(String((err as { parent?: { code?: string } })?.parent?.code));
}

export async function bookVisit(opts: { proposalId: string; materialId: string; mode: Mode; start: Date; actor: Actor; now?: Date }) {
  const { actor } = opts;
  const now = opts.now ?? new Date();
  // Patients reach only their own proposals; staff only their clinic's. Others get 404.
  const p = await getBookableProposal({ user: actor.user, id: opts.proposalId });
  if (p.status !== "open") throw conflict("This proposal is closed: ask the clinic for a new one.");
  const option = allowedOption(p, opts.materialId, opts.mode);
  const setup = (await readClinic(p.clinicId))!;
  const { timeline, furnaceIds } = await loadTimeline({ clinicId: setup.id, clinic: setup, materialId: opts.materialId, mode: opts.mode, tooth: p.tooth });
  assertBookableTime(await loadRules(setup), timeline, opts.start, now);
  const question: AlternativesQuestion = { proposal: p, materialId: opts.materialId, mode: opts.mode, wanted: opts.start, zone: setup.timeZone, now };

  for (let attempt = 1; ; attempt++) {
    try {
      const outcome = await sequelize.transaction(async (transaction): Promise<{ booked: Appointment } | { taken: true }> => {
        const [active] = await selectRows<{ id: string }>(`SELECT id FROM appointments WHERE proposal_id = $1 AND status = ANY($2::text[]) LIMIT 1`, [p.id, [...ACTIVE_STATUSES]], transaction);
        if (active) throw conflict("This proposal already has a visit booked. Move or cancel that visit instead of booking another.", { appointmentId: active.id });
        let placed: Awaited<ReturnType<typeof placeAt>>;
        try {
          placed = await placeAt({ clinic: setup, proposal: p, timeline, furnaceIds, start: opts.start, now, transaction });
        } catch (err) {
          if (!(err instanceof SlotTaken)) throw err;
          // Ends the transaction, and with it the clinic's turn, before the nearest times are looked up.
          return { taken: true };
        }
        const { assignment, rules } = placed;
        const clinic = (await Clinic.findByPk(setup.id, { transaction }))!;
        // A new visit starts with the patient's standing reminder preference; they can still change it per visit.
        const patient = await Patient.findByPk(p.patientId, { attributes: ["reminders"], transaction });
        const appointment = await Appointment.create(
          {
            clinicId: clinic.id,
            proposalId: p.id,
            patientId: p.patientId,
            dentistId: p.dentistId,
            materialId: opts.materialId,
            mode: opts.mode,
            tooth: p.tooth,
            startsAt: opts.start,
            endsAt: new Date(opts.start.getTime() + timeline.totalMinutes * MIN),
            chairId: assignment.chair!,
            millId: assignment.mill!,
            furnaceId: assignment.furnace,
            feeCents: option.feeCents ?? p.feeCents,
            remindersEnabled: patient?.reminders ?? true,
            createdBy: actor.user.id,
          },
          { transaction },
        );
        await askDeposit(appointment, clinic, actor.user.id, transaction);
        await writeSchedule({ appointment, timeline, start: opts.start, assignment, bufferMinutes: rules.bufferMinutes, transaction });
        await recordAudit(
          { clinicId: clinic.id, actorUserId: actor.user.id, action: "visit.requested", subjectType: "appointment", subjectId: appointment.id, ip: actor.ip, userAgent: actor.userAgent, data: { start: opts.start.toISOString(), materialId: opts.materialId, mode: opts.mode } },
          transaction,
        );
        return { booked: appointment };
      });
      if ("taken" in outcome) throw slotTaken(await alternatives(question));
      return outcome.booked;
    } catch (err) {
      if (err instanceof UniqueConstraintError && String(err.parent?.message ?? "").includes("appointments_one_active_per_proposal")) {
        throw conflict("This proposal already has a visit booked. Move or cancel that visit instead of booking another.");
      }
      if (!isRaceLoss(err)) throw err;
      // Another booking took a resource between our read and our insert: look again, maybe another chair or mill is free.
      if (err instanceof SlotTaken || attempt >= ATTEMPTS) {
        throw slotTaken(await alternatives(question));
      }
    }
  }
}

/** Moves an active visit to a new start, re-checked against availability; reservations are replaced. */
export async function rescheduleVisit(opts: { appointment: Appointment; start: Date; actor: Actor; now?: Date; status?: "requested" | "confirmed" }) {
  const now = opts.now ?? new Date();
  const { appointment, actor } = opts;
  const proposal = await Proposal.findByPk(appointment.proposalId);
  if (!proposal) throw notFound("That proposal");
  const clinic = (await Clinic.findByPk(appointment.clinicId))!;
  const { timeline, furnaceIds } = await loadTimeline({ clinicId: clinic.id, materialId: appointment.materialId, mode: appointment.mode, tooth: appointment.tooth });
  try {
    return await sequelize.transaction(async (transaction) => {
      await takeScheduleTurn(clinic.id, transaction);
      const fresh = await Appointment.findByPk(appointment.id, { transaction, lock: transaction.LOCK.UPDATE });
      if (!fresh || !["requested", "confirmed"].includes(fresh.status)) throw conflict("Only a requested or confirmed visit can be moved.");
      await Reservation.update({ active: false }, { where: { appointmentId: fresh.id }, transaction });
      const { assignment, rules } = await placeAt({ clinic, proposal, timeline, furnaceIds, start: opts.start, now, excludeAppointmentId: fresh.id, transaction });
      await AppointmentStage.destroy({ where: { appointmentId: fresh.id }, transaction });
      await Reservation.destroy({ where: { appointmentId: fresh.id }, transaction });
      const from = fresh.startsAt;
      await fresh.update(
        { startsAt: opts.start, endsAt: new Date(opts.start.getTime() + timeline.totalMinutes * MIN), chairId: assignment.chair!, millId: assignment.mill!, furnaceId: assignment.furnace, status: opts.status ?? fresh.status },
        { transaction },
      );
      await writeSchedule({ appointment: fresh, timeline, start: opts.start, assignment, bufferMinutes: rules.bufferMinutes, transaction });
      await recordAudit(
        { clinicId: clinic.id, actorUserId: actor.user.id, action: "visit.moved", subjectType: "appointment", subjectId: fresh.id, ip: actor.ip, userAgent: actor.userAgent, data: { from: from.toISOString(), to: opts.start.toISOString() } },
        transaction,
      );
      return fresh;
    });
  } catch (err) {
    if (!isRaceLoss(err)) throw err;
    throw new AppError(409, "That time is not free any more. Here are the nearest free times.", {
      code: "slot_taken",
      extra: { alternatives: await alternatives({ proposal, materialId: appointment.materialId, mode: appointment.mode, wanted: opts.start, zone: clinic.timeZone, now, excludeAppointmentId: appointment.id }) },
    });
  }
}

