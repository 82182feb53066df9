import type { Metadata } from "next";
import { CautionsNote } from "@/components/cautions-note";
import { requirePageUser } from "@/lib/auth/session";
import { getPlanSettings } from "@/lib/data/plan-settings";
import { FiringsForm } from "./firings-form";
import { ProgrammeForm } from "./programme-form";
import { StageOrderForm } from "./stage-order-form";

export const metadata: Metadata = { title: "Visit plan" };

export default async function PlanSettingsPage() {
  const user = await requirePageUser(["admin"]);
  const { materials, programmes, furnaces } = await getPlanSettings({ clinicId: user.clinicId! });
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Visit plan: stage orders and furnace programmes</h1>
      <CautionsNote />
      <section className="card space-y-3" aria-labelledby="programmes">
        <h2 id="programmes" className="text-lg font-bold">Furnace programmes</h2>
        <p className="text-sm text-ink-soft">
          A programme is a firing your furnaces run, with its length. Tick the furnaces able to run it: a visit is only planned on
          one of them, and a finish whose programme no working furnace can run is not offered to patients.
        </p>
        <ul className="divide-y divide-line">
          {programmes.map((p) => <li key={p.id} className="py-3"><ProgrammeForm programme={p} furnaces={furnaces} /></li>)}
        </ul>
        <h3 className="font-semibold">Add a programme</h3>
        <ProgrammeForm furnaces={furnaces} />
      </section>
      <section className="card space-y-3" aria-labelledby="firings">
        <h2 id="firings" className="text-lg font-bold">Firings per material and mode</h2>
        <p className="text-sm text-ink-soft">With a programme, the firing lasts the programme&apos;s minutes. Without one, any furnace is used for the minutes given here or under Stage durations.</p>
        <FiringsForm materials={materials} programmes={programmes} />
      </section>
      <section className="space-y-3" aria-labelledby="orders">
        <h2 id="orders" className="text-lg font-bold">Stage order per material</h2>
        <p className="text-sm text-ink-soft">
          The order keeps some rules: check-in first; preparation, scan, design and fabrication in that order; firings, finishing and try-in
          after fabrication; a sintered crown tried in after sintering; the glaze firing after the glaze; cementation after all of these;
          aftercare last. A glaze firing applies only to a stain-and-glaze finish.
        </p>
        <div className="grid gap-4 md:grid-cols-2">
          {materials.map((m) => (
            <div key={m.id} className="card space-y-2">
              <h3 className="font-semibold">{m.name}{m.active ? "" : " (not offered)"}</h3>
              <StageOrderForm material={m} />
            </div>
          ))}
        </div>
      </section>
    </div>
  );
}
