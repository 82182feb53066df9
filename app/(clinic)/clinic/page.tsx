import type { Metadata } from "next";
import Link from "next/link";
import { StatusBadge } from "@/components/visits/status-badge";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { clinicOf } from "@/lib/data/clinics";
import { listVisits } from "@/lib/data/visits";
import { addDays, localDate, zonedTime } from "@/lib/domain/time-zone";
import { clock, MODE_WORDS } from "@/lib/format";

export const metadata: Metadata = { title: "Clinic" };

export default async function ClinicHomePage() {
  const user = await requirePageUser(STAFF_ROLES);
  const clinic = await clinicOf(user);
  const today = localDate(new Date(), clinic.timeZone);
  const [todays, requests] = await Promise.all([
    listVisits({ user, from: zonedTime(today, "00:00", clinic.timeZone), to: zonedTime(addDays(today, 1), "00:00", clinic.timeZone), statuses: ["requested", "confirmed", "checked_in", "in_progress", "completed"] }),
    listVisits({ user, statuses: ["requested"] }),
  ]);
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <h1 className="text-2xl font-bold">{clinic.name}</h1>
          <p className="text-ink-soft">Today, {new Intl.DateTimeFormat("en-CA", { dateStyle: "full", timeZone: clinic.timeZone }).format(new Date())}</p>
        </div>
        <div className="flex flex-wrap gap-2">
          {user.role === "dentist" || user.role === "admin" ? <Link href="/clinic/proposals/new" className="btn-primary">New crown proposal</Link> : null}
          {user.role !== "dentist" ? (
            <Link href="/clinic/requests" className="btn-quiet" data-testid="requests-link">Visit requests ({requests.length})</Link>
          ) : null}
        </div>
      </div>
      <section aria-labelledby="today" className="space-y-3">
        <h2 id="today" className="text-lg font-semibold">Today&apos;s crown visits</h2>
        {todays.length === 0 ? <p className="card text-ink-soft">No crown visits today.</p> : (
          <ul className="grid gap-3 md:grid-cols-2">
            {todays.map((v) => (
              <li key={v.id} className="card flex items-start justify-between gap-3">
                <div>
                  <p className="font-semibold"><Link href={`/clinic/visits/${v.id}`}>{v.patientName}</Link></p>
                  <p className="text-sm text-ink-soft">{clock(v.start, v.zone)}–{clock(v.end, v.zone)} · tooth {v.tooth.fdi} · {v.material} · {MODE_WORDS[v.mode].name}</p>
                </div>
                <StatusBadge status={v.status} />
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
