// Demo crown proposals: the demo patient has an open one for a lower left first molar.
import type { Transaction } from "sequelize";
import { Material, Proposal, ProposalMaterial } from "@/db/models";
import type { seedClinic } from "./demo-clinic";

type Demo = Awaited<ReturnType<typeof seedClinic>>;

export async function seedProposals(demo: Demo, transaction: Transaction, _now: Date) {
  const materials = await Material.findAll({ where: { clinicId: demo.clinic.id }, transaction });
  const byKey = Object.fromEntries(materials.map((m) => [m.key, m]));
  const proposal = await Proposal.create(
    {
      clinicId: demo.clinic.id,
      patientId: demo.patient.id,
      dentistId: demo.users.dentist.id,
      tooth: 36,
      feeCents: 145000,
      note: "The old filling has cracked the tooth. A crown will protect what is left of it.",
    },
    { transaction },
  );
  await ProposalMaterial.bulkCreate(
    [
      { proposalId: proposal.id, materialId: byKey["zirconia"].id, modes: ["rapid", "standard"] },
      { proposalId: proposal.id, materialId: byKey["lithium-disilicate"].id, modes: ["standard", "refined"] },
      { proposalId: proposal.id, materialId: byKey["resin-ceramic-hybrid"].id, modes: ["standard"] },
    ],
    { transaction },
  );
  return { proposal };
}
