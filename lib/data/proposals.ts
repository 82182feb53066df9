// Data access for crown proposals.
import "server-only";
import { Op } from "sequelize";
import { Appointment, Material, MaterialMode, Patient, Proposal, ProposalMaterial, User, sequelize } from "@/db/models";
import { selectRows } from "@/db/select-rows";
import type { SessionUser } from "@/lib/auth/session";
import { ACTIVE_STATUSES, type Mode } from "@/lib/domain/types";
import { describeTooth } from "@/lib/domain/tooth";
import { recordAudit } from "@/lib/server/audit";
import { badRequest, conflict, forbidden, notFound, unprocessable } from "@/lib/server/errors";
import { assertCanSee, patientOf } from "./access";
import type { ProposalInput } from "@/lib/booking/schemas";

const include = [
  { model: ProposalMaterial, as: "options", include: [{ model: Material, as: "material", include: [{ model: MaterialMode, as: "modes" }] }] },
  { model: Patient, as: "patient", include: [{ model: User, as: "user", attributes: ["id", "name", "email"] }] },
  { model: User, as: "dentist", attributes: ["id", "name"] },
];

export type ProposalView = ReturnType<typeof toView>;

function toView(p: Proposal, activeVisit: Appointment | null) {
  return {
    id: p.id,
    tooth: describeTooth(p.tooth),
    feeCents: p.feeCents,
    note: p.note,
    status: p.status,
    createdAt: p.createdAt.toISOString(),
    patient: { id: p.patientId, name: p.patient?.user?.name ?? null },
    dentist: { id: p.dentistId, name: p.dentist?.name ?? null },
    materials: (p.options ?? [])
      .slice()
      .sort((a, b) => (a.material?.sortOrder ?? 0) - (b.material?.sortOrder ?? 0))
      .map((o) => ({
        id: o.materialId,
        key: o.material!.key,
        name: o.material!.name,
        // The dentist's fee for this material, else the proposal's single fee.
        feeCents: o.feeCents ?? p.feeCents,
        modes: o.modes.filter((m) => o.material!.modes?.some((mm) => mm.mode === m)),
      })),
    activeVisit: activeVisit ? { id: activeVisit.id, status: activeVisit.status, startsAt: activeVisit.startsAt.toISOString() } : null,
  };
}

async function activeVisits(proposalIds: string[]) {
  if (!proposalIds.length) return new Map<string, Appointment>();
  const rows = await Appointment.findAll({ where: { proposalId: { [Op.in]: proposalIds }, status: { [Op.in]: [...ACTIVE_STATUSES] } } });
  return new Map(rows.map((a) => [a.proposalId, a]));
}

export async function listProposals({ user }: { user: SessionUser }) {
  const where = user.role === "patient" ? { patientId: (await patientOf(user)).id } : { clinicId: user.clinicId! };
  const rows = await Proposal.findAll({ where, include, order: [["createdAt", "DESC"]] });
  const active = await activeVisits(rows.map((r) => r.id));
  return rows.map((r) => toView(r, active.get(r.id) ?? null));
}

export async function getProposal({ user, id }: { user: SessionUser; id: string }) {
  const row = /^[0-9a-f-]{36}$/i.test(id) ? await Proposal.findByPk(id, { include }) : null;
  await assertCanSee(user, row, "That proposal");
  const active = await activeVisits([row!.id]);
  return { row: row!, view: toView(row!, active.get(row!.id) ?? null) };
}

type OptionLike = { materialId: string; modes: Mode[]; feeCents?: number | null; material?: { name: string } | null };

/** The proposal's allowed material and mode, or a clear 4xx. */
export function allowedOption<O extends OptionLike>(row: { options?: O[] }, materialId: string, mode: Mode): O {
  const option = row.options?.find((o) => o.materialId === materialId);
  if (!option) throw unprocessable("This proposal does not offer that material.", "materialId");
  if (!option.modes.includes(mode)) throw unprocessable(`This proposal does not offer ${option.material?.name ?? "that material"} in the ${mode} mode.`, "mode");
  return option;
}

export type BookableProposal = {
  id: string;
  clinicId: string;
  patientId: string;
  dentistId: string;
  tooth: number;
  feeCents: number;
  status: string;
  options: OptionLike[];
};

/**
 * What a search for free times needs of a proposal, as plain values in one query (the proposal,
 * its patient's account and its options), with the same access rule as `getProposal`: a patient's
 * own, or the staff member's clinic's; anything else is a 404.
 */
export async function getBookableProposal({ user, id }: { user: SessionUser; id: string }): Promise<BookableProposal> {
  const [row] = /^[0-9a-f-]{36}$/i.test(id)
    ? await selectRows<BookableProposal & { patientUserId: string }>(
        `SELECT p.id, p.clinic_id AS "clinicId", p.patient_id AS "patientId", p.dentist_id AS "dentistId", p.tooth, p.fee_cents AS "feeCents", p.status,
                pat.user_id AS "patientUserId",
                coalesce(json_agg(json_build_object('materialId', pm.material_id, 'modes', pm.modes, 'feeCents', pm.fee_cents, 'material', json_build_object('name', m.name)))
                  FILTER (WHERE pm.material_id IS NOT NULL), '[]') AS options
           FROM proposals p
           JOIN patients pat ON pat.id = p.patient_id
           LEFT JOIN proposal_materials pm ON pm.proposal_id = p.id
           LEFT JOIN materials m ON m.id = pm.material_id
          WHERE p.id = $1
          GROUP BY p.id, pat.user_id`,
        [id],
      )
    : [];
  const visible = row && (user.role === "patient" ? row.patientUserId === user.id : row.clinicId === user.clinicId);
  if (!visible) throw notFound("That proposal");
  return { id: row.id, clinicId: row.clinicId, patientId: row.patientId, dentistId: row.dentistId, tooth: row.tooth, feeCents: row.feeCents, status: row.status, options: row.options };
}

/** The dentist who proposes: a dentist proposes as themself; a manager must name an active dentist of the clinic. */
async function proposalDentist(user: SessionUser, named: string | undefined): Promise<string> {
  if (user.role === "dentist") return user.id;
  if (!named) throw badRequest("Choose the dentist who proposes this crown.", "dentistId");
  const dentist = await User.findOne({ where: { id: named, clinicId: user.clinicId!, role: "dentist", active: true }, attributes: ["id"] });
  if (!dentist) throw badRequest("Choose an active dentist of this clinic.", "dentistId");
  return dentist.id;
}

export async function createProposal({ user, input, ip, userAgent }: { user: SessionUser; input: ProposalInput; ip?: string; userAgent?: string }) {
  const patient = await Patient.findOne({ where: { id: input.patientId, clinicId: user.clinicId! } });
  if (!patient) throw notFound("That patient");
  if (patient.archivedAt) throw conflict("This patient is archived. Unarchive them before proposing a crown.");
  const dentistId = await proposalDentist(user, input.dentistId);
  const materials = await Material.findAll({ where: { id: { [Op.in]: input.options.map((o) => o.materialId) }, clinicId: user.clinicId!, active: true }, include: [{ model: MaterialMode, as: "modes" }] });
  for (const option of input.options) {
    const material = materials.find((m) => m.id === option.materialId);
    if (!material) throw unprocessable("One of the materials is not in this clinic's catalogue.", "options");
    const toothClass = describeTooth(input.tooth).toothClass;
    if (!material.toothClasses.includes(toothClass)) throw unprocessable(`${material.name} is not indicated for a ${toothClass} tooth in this clinic's catalogue.`, "options");
    const missing = option.modes.filter((m) => !material.modes?.some((mm) => mm.mode === m));
    if (missing.length) throw unprocessable(`${material.name} has no ${missing.join(", ")} mode here.`, "options");
  }
  return sequelize.transaction(async (transaction) => {
    const proposal = await Proposal.create(
      { clinicId: user.clinicId!, patientId: patient.id, dentistId, tooth: input.tooth, feeCents: Math.round(input.fee * 100), note: input.note || null },
      { transaction },
    );
    // Each material's fee: the dentist's, else the clinic's list price, else the proposal's fee (null).
    const listFee = (id: string) => materials.find((m) => m.id === id)?.listFeeCents ?? null;
    await ProposalMaterial.bulkCreate(
      input.options.map((o) => ({ proposalId: proposal.id, materialId: o.materialId, modes: o.modes, feeCents: o.fee !== undefined ? Math.round(o.fee * 100) : listFee(o.materialId) })),
      { transaction },
    );
    await recordAudit({ clinicId: user.clinicId, actorUserId: user.id, action: "proposal.created", subjectType: "proposal", subjectId: proposal.id, ip, userAgent, data: { tooth: input.tooth } }, transaction);
    return proposal;
  });
}

/** The choices on the new-proposal form: the clinic's patients and active dentists. Dentists and managers only. */
export async function proposalFormChoices({ user }: { user: SessionUser }) {
  if (user.role !== "dentist" && user.role !== "admin") throw forbidden();
  const [patients, dentists] = await Promise.all([
    Patient.findAll({ where: { clinicId: user.clinicId!, archivedAt: null }, include: [{ model: User, as: "user", attributes: ["name", "email"] }] }),
    User.findAll({ where: { clinicId: user.clinicId!, role: "dentist", active: true }, attributes: ["id", "name"] }),
  ]);
  return {
    patients: patients.map((p) => ({ id: p.id, name: p.user?.name ?? p.user?.email ?? "Patient" })).sort((a, b) => a.name.localeCompare(b.name)),
    dentists: dentists.map((d) => ({ id: d.id, name: d.name ?? "Dentist" })),
  };
}
