import type { Metadata } from "next";
import { requirePageUser } from "@/lib/auth/session";
import { listMaterials, materialEstimates } from "@/lib/data/materials";
import { proposalFormChoices } from "@/lib/data/proposals";
import { ProposalForm } from "./proposal-form";

export const metadata: Metadata = { title: "New crown proposal" };

export default async function NewProposalPage({ searchParams }: { searchParams: Promise<{ patient?: string }> }) {
  const user = await requirePageUser(["dentist", "admin"]);
  const { patient: preselected } = await searchParams;
  const [{ patients, dentists }, materials, estimates] = await Promise.all([
    proposalFormChoices({ user }),
    listMaterials({ clinicId: user.clinicId! }),
    materialEstimates({ clinicId: user.clinicId! }),
  ]);
  return (
    <div className="mx-auto max-w-read space-y-4">
      <h1 className="text-2xl font-bold">New crown proposal</h1>
      <p className="text-ink-soft">Propose a single crown for one tooth and choose which materials and finishes the patient may pick from. Each material&apos;s fee starts at the clinic&apos;s list price; change it here for this patient.</p>
      <ProposalForm
        role={user.role}
        patients={patients}
        patientId={preselected}
        dentists={dentists}
        materials={materials.map((m) => ({
          id: m.id, name: m.name, toothClasses: m.indications.toothClasses, modes: m.modes.map((x) => x.mode),
          cautions: m.cautions, provisionalOnly: m.indications.provisionalOnly, estimates: estimates[m.id] ?? {},
          listFee: m.listFeeCents == null ? "" : (m.listFeeCents / 100).toFixed(2),
        }))}
      />
    </div>
  );
}
