import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { listClinicPatients } from "@/lib/data/patient-directory";
import { LOCALE_ENGLISH_NAMES } from "@/lib/i18n/locale";

export const metadata: Metadata = { title: "Patients" };

export default async function PatientsPage() {
  const user = await requirePageUser(STAFF_ROLES);
  const patients = await listClinicPatients({ clinicId: user.clinicId! });
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Patients</h1>
      <section className="card" aria-label="Patients of the clinic">
        {patients.length === 0 ? (
          <p className="text-ink-soft">No patients yet.</p>
        ) : (
          <ul className="divide-y divide-line">
            {patients.map((p) => (
              <li key={p.id} className="flex flex-col gap-1 py-3 sm:flex-row sm:items-center sm:justify-between">
                <Link href={`/clinic/patients/${p.id}`} className="inline-flex min-h-6 items-center font-semibold">{p.name}</Link>
                <span className="text-sm text-ink-muted">
                  {p.email}{p.dateOfBirth ? ` · born ${p.dateOfBirth}` : ""} · <span data-testid="patient-language">{LOCALE_ENGLISH_NAMES[p.language]}</span>
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
