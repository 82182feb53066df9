import type { Metadata } from "next";
import { requirePageUser } from "@/lib/auth/session";
import { listMaterialTexts } from "@/lib/data/materials";
import { CAUTIONS_RULE, materialTextsFormValues } from "@/lib/domain/material-text-schemas";
import { MaterialTextsForm } from "./material-texts-form";

export const metadata: Metadata = { title: "Material texts" };

export default async function MaterialTextsPage() {
  const user = await requirePageUser(["admin"]);
  const materials = await listMaterialTexts({ clinicId: user.clinicId! });
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Material texts for patients</h1>
      <p className="text-sm text-ink-soft">
        Patients read these when they compare materials, in English or in French. Write in plain words; give advantages and
        cautions one per line. {CAUTIONS_RULE}
      </p>
      <p className="text-sm text-ink-muted" data-testid="cautions-note">
        These texts inform patients; they do not replace the conversation chairside. The dentist&apos;s judgment, local regulations and
        licensed practice prevail.
      </p>
      {materials.length ? (
        materials.map((m) => (
          <section key={m.id} className="card space-y-3" aria-labelledby={`mt-${m.id}`}>
            <h2 id={`mt-${m.id}`} className="text-lg font-bold">
              {m.en.name}
              {m.active ? null : <span className="ml-2 text-sm font-normal text-ink-muted">(not offered to patients)</span>}
            </h2>
            <MaterialTextsForm values={materialTextsFormValues(m)} />
          </section>
        ))
      ) : (
        <p className="text-sm text-ink-muted">This clinic has no materials yet.</p>
      )}
    </div>
  );
}
