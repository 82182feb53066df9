import type { Metadata } from "next";
import { requirePageUser } from "@/lib/auth/session";
import { getTwoFactorRequirement, listStaffAccounts } from "@/lib/data/settings";
import { NewStaffForm, StaffRowForm, TwoFactorRequirementForm } from "./staff-forms";

export const metadata: Metadata = { title: "Staff" };

export default async function StaffSettingsPage() {
  const user = await requirePageUser(["admin"]);
  const [staff, requireTwoFactor] = await Promise.all([listStaffAccounts({ clinicId: user.clinicId! }), getTwoFactorRequirement({ clinicId: user.clinicId! })]);
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Staff accounts</h1>
      <section className="card space-y-2" aria-labelledby="staff-list">
        <h2 id="staff-list" className="text-lg font-bold">Accounts</h2>
        <ul className="divide-y divide-line">
          {staff.map((s) => <li key={s.id} className="py-2"><StaffRowForm person={s} self={s.id === user.id} /></li>)}
        </ul>
      </section>
      <section className="card space-y-2" aria-labelledby="staff-sign-in">
        <h2 id="staff-sign-in" className="text-lg font-bold">Two-factor sign-in</h2>
        <TwoFactorRequirementForm required={requireTwoFactor} />
      </section>
      <section className="card space-y-2" aria-labelledby="staff-add">
        <h2 id="staff-add" className="text-lg font-bold">Add a staff account</h2>
        <NewStaffForm />
      </section>
    </div>
  );
}
