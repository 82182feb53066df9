import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser } from "@/lib/auth/session";
import { listEquipment } from "@/lib/data/settings";
import { EquipmentForm } from "./equipment-form";

export const metadata: Metadata = { title: "Equipment" };

export default async function EquipmentSettingsPage() {
  const user = await requirePageUser(["admin"]);
  const equipment = await listEquipment({ clinicId: user.clinicId! });
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Chairs, mills and furnaces</h1>
      <p className="text-ink-soft">
        Retired equipment gets no new visits; visits already booked on it stay. To take something out of service for a while,
        use <Link href="/clinic/board/equipment" className="inline-flex min-h-6 items-center">equipment status</Link>.
      </p>
      <section className="card space-y-2" aria-labelledby="eq-list">
        <h2 id="eq-list" className="text-lg font-bold">Equipment</h2>
        <ul className="divide-y divide-line">
          {equipment.map((e) => (
            <li key={e.id} className="py-2"><EquipmentForm item={e} /></li>
          ))}
        </ul>
      </section>
      <section className="card space-y-2" aria-labelledby="eq-add">
        <h2 id="eq-add" className="text-lg font-bold">Add equipment</h2>
        <EquipmentForm />
      </section>
    </div>
  );
}
