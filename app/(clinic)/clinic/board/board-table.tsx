// The board as a table: the same data as the lanes, for keyboards, screen readers and small screens.
import Link from "next/link";
import type { Board } from "@/lib/data/board";
import { hhmm, longDay, shiftText, STATE_LABEL, STATUS_LABEL } from "./board-format";

export function BoardTable({ board }: { board: Board }) {
  const laneName = new Map(board.lanes.map((l) => [l.id, l.name]));
  return (
    <div className="card overflow-x-auto" data-testid="board-table">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="mb-2 text-left font-semibold">Stages of every visit on {longDay(board.day)} (clinic time)</caption>
        <thead>
          <tr className="border-b border-line">
            <th scope="col" className="py-2 pr-3">Stage</th>
            <th scope="col" className="py-2 pr-3">Where</th>
            <th scope="col" className="py-2 pr-3">Planned</th>
            <th scope="col" className="py-2 pr-3">Actual or expected</th>
            <th scope="col" className="py-2 pr-3">State</th>
            <th scope="col" className="py-2 pr-3">Against plan</th>
          </tr>
        </thead>
        {board.visits.map((v) => {
          const conflicts = board.conflicts.filter((c) => c.visitId === v.id);
          return (
            <tbody key={v.id} className="border-b-2 border-line" data-testid="board-table-visit" data-visit={v.id}>
              <tr className="bg-paper-deep">
                <th scope="rowgroup" colSpan={6} className="px-2 py-2 font-semibold">
                  <Link href={`/clinic/visits/${v.id}`} className="inline-flex min-h-6 items-center">
                    {v.initials} · tooth {v.tooth.label} · {v.material} · {v.mode}
                  </Link>
                  <span className="ml-2 font-normal text-ink-soft">
                    {STATUS_LABEL[v.status]} · {hhmm(v.plannedStart)}–{hhmm(v.plannedEnd)} planned, ends about {hhmm(v.projectedEnd)} ({shiftText(v.delayMinutes)}) · {v.dentist}
                    {" · "}{v.block.loadedAt ? `block loaded ${hhmm(v.block.loadedAt)}` : "block not loaded"}{v.block.shade ? ` · shade ${v.block.shade}` : ""}
                  </span>
                  {conflicts.map((c) => (
                    <span key={c.stageKey} className="mt-1 block font-normal text-clay-700">⚠ Conflict: {c.message} Proposal: {c.proposal}</span>
                  ))}
                </th>
              </tr>
              {v.stages.map((s) => (
                <tr key={s.key} className="border-t border-line">
                  <th scope="row" className="py-1 pr-3 font-normal">{s.label}</th>
                  <td className="py-1 pr-3">{[...s.laneIds.map((id) => laneName.get(id) ?? ""), ...(s.equipment.includes("dentist") ? [v.dentist] : [])].join(", ") || "—"}</td>
                  <td className="py-1 pr-3 tabular-nums">{hhmm(s.plannedStart)}–{hhmm(s.plannedEnd)}</td>
                  <td className="py-1 pr-3 tabular-nums">{hhmm(s.start)}–{hhmm(s.end)}{s.state === "running" ? " (running)" : ""}</td>
                  <td className="py-1 pr-3">{STATE_LABEL[s.state]}</td>
                  <td className="py-1 pr-3">{shiftText(s.shiftMinutes)}</td>
                </tr>
              ))}
            </tbody>
          );
        })}
      </table>
    </div>
  );
}
