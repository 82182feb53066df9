// Conflicts of the projected day, in words: what would collide, and what the board proposes.
import Link from "next/link";
import type { Board } from "@/lib/data/board";
import { hhmm } from "./board-format";

/** HH:MM on the board's day, or the date too when another day. */
const when = (iso: string, day: string) => (iso.slice(0, 10) === day ? hhmm(iso) : `${iso.slice(0, 10)} ${hhmm(iso)}`);

export function BoardConflicts({ board }: { board: Board }) {
  const late = board.visits.filter((v) => v.delayMinutes > 0 && v.status !== "completed");
  const outages = board.lanes.flatMap((l) => l.outages.map((o) => ({ ...o, lane: l.name })));
  if (board.conflicts.length === 0 && late.length === 0 && outages.length === 0) {
    return <p className="rounded-lg border border-sage-600 bg-sage-50 p-3 text-sm font-medium text-sage-700" data-testid="board-no-conflicts">No conflicts: every visit fits its chair, mill, furnace and dentist.</p>;
  }
  return (
    <section aria-labelledby="conflicts-heading" className="space-y-2">
      {board.conflicts.length > 0 ? (
        <div className="rounded-card border-2 border-clay-600 bg-clay-50 p-4" data-testid="board-conflicts">
          <h2 id="conflicts-heading" className="text-lg font-bold text-clay-700">
            {board.conflicts.length === 1 ? "1 conflict" : `${board.conflicts.length} conflicts`} to resolve
          </h2>
          <ul className="mt-2 space-y-2">
            {board.conflicts.map((c) => (
              <li key={`${c.visitId}-${c.stageKey}`} className="text-sm" data-testid="board-conflict">
                <p className="font-semibold text-ink">{c.message}</p>
                <p className="text-ink-soft">
                  Proposal: {c.proposal} <Link href={`/clinic/visits/${c.visitId}`} className="inline-flex min-h-6 items-center">Open the visit</Link>
                </p>
              </li>
            ))}
          </ul>
        </div>
      ) : (
        <h2 id="conflicts-heading" className="sr-only">Delays and equipment</h2>
      )}
      {late.length > 0 ? (
        <p className="rounded-lg border border-ochre-600 bg-ochre-50 p-3 text-sm text-ochre-700" data-testid="board-delays">
          <strong>Running late:</strong>{" "}
          {late.map((v) => `${v.initials} (tooth ${v.tooth.fdi}) ends about ${hhmm(v.projectedEnd)}, ${v.delayMinutes} min after plan`).join("; ")}.
        </p>
      ) : null}
      {outages.length > 0 ? (
        <p className="rounded-lg border border-line bg-white p-3 text-sm text-ink-soft">
          <strong className="text-ink">Out of service:</strong>{" "}
          {outages.map((o) => `${o.lane} ${when(o.start, board.day)}–${when(o.end, board.day)}${o.reason ? ` (${o.reason})` : ""}`).join("; ")}.
        </p>
      ) : null}
    </section>
  );
}
