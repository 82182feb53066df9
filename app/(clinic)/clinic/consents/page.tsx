import type { Metadata } from "next";
import Link from "next/link";
import { CautionsNote } from "@/components/cautions-note";
import { ConsentStatusChip } from "@/components/consent/consent-status";
import { FlagList } from "@/components/consent/flag-list";
import { StatusBadge } from "@/components/visits/status-badge";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { listConsents, todaysVisits } from "@/lib/data/consents";
import { clock, when } from "@/lib/format";
import { AppError } from "@/lib/server/errors";

export const metadata: Metadata = { title: "Consents today" };

/** A page of the clinic's consent records, or null when the page link's cursor is not valid. */
async function recordsPage(user: Parameters<typeof listConsents>[0]["user"], cursor: string | undefined) {
  try {
    return await listConsents({ user, cursor: cursor || null });
  } catch (err) {
    if (err instanceof AppError && err.status === 400) return null;
    throw err;
  }
}

/**
 * Chairside list: today's visits (clinic time) with consent status and health flags; below it
 * every consent record of the clinic, newest first, a page at a time ("Older consents" carries
 * the position in the address, so it needs no script).
 */
export default async function ConsentsTodayPage({ searchParams }: { searchParams: Promise<{ cursor?: string | string[] }> }) {
  const user = await requirePageUser(STAFF_ROLES);
  const sp = await searchParams;
  const cursor = typeof sp.cursor === "string" ? sp.cursor : undefined;
  const [{ day, timeZone, rows }, records] = await Promise.all([todaysVisits({ user }), recordsPage(user, cursor)]);
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
      <section aria-labelledby="all-consents" className="space-y-3">
        <h2 id="all-consents" className="text-xl font-semibold">All consent records{cursor && records ? ", older" : ""}</h2>
        {!records ? (
          <p className="card" data-testid="consent-records-invalid">
            That page link is not valid. <Link href="/clinic/consents#all-consents">Show the newest consents</Link>
          </p>
        ) : records.consents.length === 0 ? (
          <p className="card">{cursor ? "No older consents." : "No consent records yet."}</p>
        ) : (
          <ul className="card divide-y divide-line py-1" data-testid="consent-records">
            {records.consents.map((c) => (
              <li key={c.id} data-testid="consent-record" className="flex flex-col gap-1 py-3 sm:flex-row sm:items-center sm:justify-between">
                <span className="block">
                  <Link href={`/clinic/consents/${c.appointmentId}`} className="font-semibold">{c.patient}</Link>
                  <span className="block text-sm text-ink-soft">
                    Visit {when(c.visitStartsAt, timeZone)}{c.signedAt ? ` · signed ${when(c.signedAt, timeZone)}` : ""}
                  </span>
                </span>
                <span className="self-start sm:self-auto"><ConsentStatusChip status={c.status} /></span>
              </li>
            ))}
          </ul>
        )}
        <nav aria-label="Consent record pages" className="flex flex-wrap justify-between gap-3">
          {cursor ? <Link href="/clinic/consents#all-consents" className="btn-quiet">Newest consents</Link> : <span />}
          {records?.nextCursor ? (
            <Link href={`/clinic/consents?${new URLSearchParams({ cursor: records.nextCursor })}#all-consents`} className="btn-quiet" data-testid="older-consents">Older consents</Link>
          ) : <span />}
        </nav>
      </section>
      <CautionsNote />
    </div>
  );
}
