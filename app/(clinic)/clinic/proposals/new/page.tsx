import type { Metadata } from "next";
import { Material, Patient, User } from "@/db/models";
import { requirePageUser } from "@/lib/auth/session";
import { listMaterials } from "@/lib/data/materials";
import { ProposalForm } from "./proposal-form";

export const metadata: Metadata = { title: "New crown proposal" };

export default async function NewProposalPage() {
  const user = await requirePageUser(["dentist", "admin"]);
  const [patients, materials, dentists, prices] = await Promise.all([
    Patient.findAll({ where: { clinicId: user.clinicId! }, include: [{ model: User, as: "user", attributes: ["name", "email"] }] }),
    listMaterials({ clinicId: user.clinicId! }),
    User.findAll({ where: { clinicId: user.clinicId!, role: "dentist", active: true }, attributes: ["id", "name"] }),
    Material.findAll({ where: { clinicId: user.clinicId! }, attributes: ["id", "listFeeCents"] }),
  ]);
  const listFee = (id: string) => {
    const cents = prices.find((p) => p.id === id)?.listFeeCents;
    return cents == null ? "" : (cents / 100).toFixed(2);
  };
  return (
    <div className="mx-auto max-w-read space-y-4">
      <h1 className="text-2xl font-bold">New crown proposal</h1>
      <p className="text-ink-soft">Propose a single crown for one tooth and choose which materials and finishes the patient may pick from. Each material&apos;s fee starts at the clinic&apos;s list price; change it here for this patient.</p>
      <ProposalForm
        role={user.role}
        patients={patients.map((p) => ({ id: p.id, name: p.user?.name ?? p.user?.email ?? "Patient" })).sort((a, b) => a.name.localeCompare(b.name))}
        dentists={dentists.map((d) => ({ id: d.id, name: d.name ?? "Dentist" }))}
        materials={materials.map((m) => ({ id: m.id, name: m.name, toothClasses: m.indications.toothClasses, modes: m.modes.map((x) => x.mode), listFee: listFee(m.id) }))}
      />
    </div>
  );
}
