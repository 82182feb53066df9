import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { patientSchemaContext, searchPatients, SORTS, type PatientSort } from "@/lib/data/patients";
import { displayPhone, LANGUAGE_NAMES } from "@/lib/domain/patient-record";

export const metadata: Metadata = { title: "Patients" };

type Search = { q?: string; page?: string; archived?: string; sort?: string };
const SORT_LABEL: Record<PatientSort, string> = { name: "Name", newest: "Newest first", birth: "Date of birth" };

export default async function PatientsPage({ searchParams }: { searchParams: Promise<Search> }) {
  const user = await requirePageUser(STAFF_ROLES);
  const sp = await searchParams;
  const q = (sp.q ?? "").slice(0, 100);
  const archived = sp.archived === "1";
  const sort = (SORTS as readonly string[]).includes(sp.sort ?? "") ? (sp.sort as PatientSort) : "name";
  const [{ patients, total, page, pageSize }, { country }] = await Promise.all([
    searchPatients({ user, q, page: Number(sp.page ?? 1), archived, sort }),
    patientSchemaContext({ clinicId: user.clinicId! }),
  ]);
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const pageHref = (n: number) => `/clinic/patients?${new URLSearchParams({ ...(q ? { q } : {}), ...(archived ? { archived: "1" } : {}), sort, page: String(n) })}`;
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-2xl font-bold">Patients</h1>
        <Link href="/clinic/patients/new" className="btn-primary">Register a patient</Link>
      </div>
      <form role="search" action="/clinic/patients" className="card grid gap-3 sm:grid-cols-[1fr_auto_auto_auto] sm:items-end">
        <div>
          <label htmlFor="q" className="field-label">Find by name, e-mail, phone or date of birth (YYYY-MM-DD)</label>
          <input id="q" name="q" type="search" defaultValue={q} className="field-input" autoComplete="off" />
        </div>
        <div>
          <label htmlFor="sort" className="field-label">Order</label>
          <select id="sort" name="sort" defaultValue={sort} className="field-input">
            {SORTS.map((s) => <option key={s} value={s}>{SORT_LABEL[s]}</option>)}
          </select>
        </div>
        <label className="inline-flex min-h-11 items-center gap-2 text-sm">
          <input type="checkbox" name="archived" value="1" defaultChecked={archived} className="h-5 w-5" /> Archived only
        </label>
        <button type="submit" className="btn-quiet">Search</button>
      </form>
      <section className="card" aria-label="Patients of the clinic">
        <p className="mb-2 text-sm text-ink-muted" data-testid="patient-count">
          {total === 0 ? (q ? "No patient matches this search." : archived ? "No archived patients." : "No patients yet.") : `${total} patient${total === 1 ? "" : "s"}${archived ? " (archived)" : ""}`}
        </p>
        {patients.length ? (
          <ul className="divide-y divide-line">
            {patients.map((p) => (
              <li key={p.id} className="flex flex-col gap-1 py-3 sm:flex-row sm:items-center sm:justify-between">
                <Link href={`/clinic/patients/${p.id}`} className="inline-flex min-h-6 items-center font-semibold">{p.name}</Link>
                <span className="text-sm text-ink-muted">
                  {[p.email, p.dateOfBirth ? `born ${p.dateOfBirth}` : null, p.phone ? displayPhone(p.phone, country) : null, p.archived ? "archived" : null].filter(Boolean).join(" · ")} · <span data-testid="patient-language">{LANGUAGE_NAMES[p.language]}</span>
                </span>
              </li>
            ))}
          </ul>
        ) : null}
        {pages > 1 ? (
          <nav aria-label="Pages" className="mt-3 flex items-center justify-between gap-3 text-sm">
            {page > 1 ? <Link href={pageHref(page - 1)} className="btn-quiet">Previous page</Link> : <span />}
            <span>Page {page} of {pages}</span>
            {page < pages ? <Link href={pageHref(page + 1)} className="btn-quiet">Next page</Link> : <span />}
          </nav>
        ) : null}
      </section>
    </div>
  );
}
