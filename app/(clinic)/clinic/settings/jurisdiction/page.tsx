import type { Metadata } from "next";
import { requirePageUser } from "@/lib/auth/session";
import { getJurisdiction } from "@/lib/data/jurisdiction";
import { JURISDICTIONS } from "@/lib/domain/jurisdiction";
import { JurisdictionForm } from "./jurisdiction-form";

export const metadata: Metadata = { title: "Jurisdiction" };

export default async function JurisdictionPage() {
  const user = await requirePageUser(["admin"]);
  const current = await getJurisdiction({ clinicId: user.clinicId! });
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Jurisdiction</h1>
      <section className="card space-y-3">
        <p className="text-sm text-ink-soft">
          The agreement to sign and receive records electronically, and the privacy wording patients read, follow the law of the
          place the clinic practises. Consents already signed keep the wording they were signed with. Local regulations and
          licensed practice prevail: check the wording with your professional body.
        </p>
        <JurisdictionForm current={current.code} options={JURISDICTIONS.map((j) => ({ code: j.code, label: j.label }))} />
      </section>
      <section className="card space-y-2" aria-labelledby="agreement-heading">
        <h2 id="agreement-heading" className="text-lg font-semibold">Agreement patients read now (English)</h2>
        {current.agreement.en.text.map((p) => <p key={p} className="text-sm">{p}</p>)}
        <p className="text-sm text-ink-muted">{current.privacy.en}</p>
      </section>
    </div>
  );
}
