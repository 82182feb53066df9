import type { Metadata } from "next";
import Link from "next/link";
import { CautionsNote } from "@/components/cautions-note";
import { ConsentStatusChip } from "@/components/consent/consent-status";
import { FlagList } from "@/components/consent/flag-list";
import { StatusBadge } from "@/components/visits/status-badge";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { todaysVisits } from "@/lib/data/consents";
import { clock } from "@/lib/format";

export const metadata: Metadata = { title: "Consents today" };

/** Chairside list: today's visits (clinic time) with consent status and health flags. */
export default async function ConsentsTodayPage() {
  const user = await requirePageUser(STAFF_ROLES);
  const { day, timeZone, rows } = await todaysVisits({ user });
  const waiting = rows.filter((r) => r.consentStatus === "signed").length;
  const dayLabel = new Intl.DateTimeFormat("en-CA", { timeZone: "UTC", weekday: "long", day: "numeric", month: "long", year: "numeric" }).format(new Date(`${day}T12:00:00Z`));

  return (
    <div className="space-y-5">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-bold">Consents today</h1>
          <p className="text-ink-soft">{dayLabel} · times in {timeZone.replace("_", " ")}</p>
        </div>
        <Link href="/clinic/consents/verify" className="btn-quiet">Check a consent PDF</Link>
      </header>
      {user.role === "dentist" && waiting > 0 ? (
        <p className="rounded-lg border border-harbour-600 bg-harbour-50 p-3 font-medium text-harbour-800">
          {waiting === 1 ? "1 signed consent is" : `${waiting} signed consents are`} waiting for your review.
        </p>
      ) : null}
      {rows.length === 0 ? <p className="card">No crown visits today.</p> : (
        <ul className="space-y-3" data-testid="consent-rows">
          {rows.map((r) => (
            <li key={r.appointmentId}>
              <Link
                href={`/clinic/consents/${r.appointmentId}`}
                className="card block text-ink no-underline hover:border-harbour-600 hover:no-underline focus-visible:border-harbour-600"
                data-testid="consent-row"
              >
                <span className="flex flex-wrap items-start justify-between gap-3">
                  <span className="block">
                    <span className="block text-lg font-semibold">{clock(r.startsAt, timeZone)} · {r.patient}</span>
                    <span className="block text-sm text-ink-soft">{r.tooth} · {r.material} · {r.dentist}</span>
                  </span>
                  <span className="flex flex-wrap gap-2">
                    <StatusBadge status={r.visitStatus} />
                    <ConsentStatusChip status={r.consentStatus} />
                  </span>
                </span>
                {r.flags.length ? <span className="mt-2 block"><FlagList flags={r.flags} compact /></span> : null}
              </Link>
            </li>
          ))}
        </ul>
      )}
      <CautionsNote />
    </div>
  );
}
