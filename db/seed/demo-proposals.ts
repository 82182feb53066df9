// Demo crown proposals and visits. The demo patient has an open proposal (tooth 36) to book,
// and a confirmed visit coming up; three other invented patients fill today's board.
import type { Transaction } from "sequelize";
import { Appointment, Material, Proposal, ProposalMaterial, type Patient } from "@/db/models";
import { loadBusy, loadResources, loadRules, loadTimeline } from "@/lib/booking/context";
import { writeSchedule } from "@/lib/booking/schedule";
import { assign, holdsFor } from "@/lib/domain/availability";
import { addDays, localDate, weekdayOf, zonedTime } from "@/lib/domain/time-zone";
import type { AppointmentStatus, Mode } from "@/lib/domain/types";
import { DEMO_LIST_PRICES, type seedClinic } from "./demo-clinic";

type Demo = Awaited<ReturnType<typeof seedClinic>>;
const MIN = 60_000;

async function propose(demo: Demo, patient: Patient, tooth: number, feeCents: number, note: string, allow: Record<string, Mode[]>, byKey: Record<string, Material>, transaction: Transaction, dentistId = demo.users.dentist.id) {
  const proposal = await Proposal.create({ clinicId: demo.clinic.id, patientId: patient.id, dentistId, tooth, feeCents, note }, { transaction });
  await ProposalMaterial.bulkCreate(Object.entries(allow).map(([key, modes]) => ({ proposalId: proposal.id, materialId: byKey[key].id, modes, feeCents: DEMO_LIST_PRICES[key] ?? null })), { transaction });
  return proposal;
}

/** Places a visit at a fixed time on the first free chair, mill and furnace (demo data skips the notice rules). */
async function placeVisit(demo: Demo, proposal: Proposal, material: Material, mode: Mode, start: Date, status: AppointmentStatus, transaction: Transaction) {
  const { timeline } = await loadTimeline({ clinicId: demo.clinic.id, materialId: material.id, mode, tooth: proposal.tooth, transaction });
  const rules = await loadRules(demo.clinic, transaction);
  const resources = await loadResources(demo.clinic.id, proposal.dentistId, transaction);
  const busy = await loadBusy({ clinicId: demo.clinic.id, resources, from: new Date(start.getTime() - 60 * MIN), to: new Date(start.getTime() + 300 * MIN), transaction });
  const assignment = assign(holdsFor(timeline, start.getTime(), rules.bufferMinutes), resources, busy);
  if (!assignment) throw new Error(`Demo visit at ${start.toISOString()} does not fit the clinic's equipment.`);
  const appointment = await Appointment.create(
    {
      clinicId: demo.clinic.id, proposalId: proposal.id, patientId: proposal.patientId, dentistId: proposal.dentistId, materialId: material.id, mode,
      tooth: proposal.tooth, status, startsAt: start, endsAt: new Date(start.getTime() + timeline.totalMinutes * MIN),
      chairId: assignment.chair!, millId: assignment.mill!, furnaceId: assignment.furnace, feeCents: proposal.feeCents, createdBy: demo.users.reception.id,
    },
    { transaction },
  );
  await writeSchedule({ appointment, timeline, start, assignment, bufferMinutes: rules.bufferMinutes, transaction });
  return appointment;
}

function nextWeekday(from: string, atLeastDays: number): string {
  let day = addDays(from, atLeastDays);
  while ([0, 6].includes(weekdayOf(day))) day = addDays(day, 1);
  return day;
}

export async function seedProposals(demo: Demo, transaction: Transaction, now: Date) {
  const materials = await Material.findAll({ where: { clinicId: demo.clinic.id }, transaction });
  const byKey = Object.fromEntries(materials.map((m) => [m.key, m]));
  const zone = demo.clinic.timeZone;
  const today = localDate(now, zone);
  const [tobias, marisol, henrik] = demo.others;

  const proposal = await propose(demo, demo.patient, 36, 145000, "The old filling has cracked the tooth. A crown will protect what is left of it.", {
    zirconia: ["rapid", "standard"],
    "lithium-disilicate": ["standard", "refined"],
    "resin-ceramic-hybrid": ["standard"],
  }, byKey, transaction);

  const zoeSecond = await propose(demo, demo.patient, 15, 132000, "A large old filling with a crack line; a crown now avoids a fracture later.", { "lithium-disilicate": ["standard"] }, byKey, transaction);
  const zoeUpcoming = await placeVisit(demo, zoeSecond, byKey["lithium-disilicate"], "standard", zonedTime(nextWeekday(today, 6), "13:30", zone), "confirmed", transaction);

  const tobiasProposal = await propose(demo, tobias, 46, 149000, "Root-treated molar that needs full coverage.", { zirconia: ["standard"] }, byKey, transaction);
  const tobiasToday = await placeVisit(demo, tobiasProposal, byKey["zirconia"], "standard", zonedTime(today, "08:00", zone), "confirmed", transaction);

  // With the second dentist in the next chair; her crown follows Tobias's on the same mill and furnace.
  const marisolProposal = await propose(demo, marisol, 26, 149000, "Cracked cusp on an upper molar.", { zirconia: ["rapid", "standard"] }, byKey, transaction, demo.users.dentist2.id);
  const marisolToday = await placeVisit(demo, marisolProposal, byKey["zirconia"], "rapid", zonedTime(today, "09:15", zone), "confirmed", transaction);

  const henrikProposal = await propose(demo, henrik, 24, 128000, "Worn premolar next to a gap.", { "lithium-disilicate": ["standard", "refined"], "leucite-glass-ceramic": ["standard"] }, byKey, transaction);
  const henrikRequested = await placeVisit(demo, henrikProposal, byKey["lithium-disilicate"], "refined", zonedTime(nextWeekday(today, 2), "08:00", zone), "requested", transaction);

  return { proposal, visits: { zoeUpcoming, tobiasToday, marisolToday, henrikRequested } };
}
