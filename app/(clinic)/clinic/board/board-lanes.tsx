// The board drawn as lanes: one row per chair, mill and furnace, time running left to right.
// Every block is a link with a full text description; the table view carries the same data.
import Link from "next/link";
import type { Board, BoardStage, BoardVisit } from "@/lib/data/board";
import { clockAt, hhmm, KIND_LABEL, ms, shiftText, STATE_LABEL, STATUS_LABEL } from "./board-format";

const PX_PER_MIN = 4;
const MIN = 60_000;

/** Gaps inside a block: the visit holds the chair while waiting for a machine. */
const WAITING = "repeating-linear-gradient(45deg, #ffffff 0 6px, #ece8df 6px 8px)";

const STATE_CLASS = {
  planned: "bg-harbour-50 border-harbour-600",
  running: "bg-ochre-50 border-ochre-600",
  done: "bg-sage-50 border-sage-600",
} as const;

type Block = { visit: BoardVisit; stages: BoardStage[]; start: number; end: number; plannedStart: number; plannedEnd: number };

/** Consecutive stages of a visit on one lane make one block: a chair stays held from check-in to
 *  cementation, also while the crown waits for a busy mill or furnace. */
function blocksOn(laneId: string, visits: BoardVisit[]): Block[] {
  const out: Block[] = [];
  for (const visit of visits) {
    let current: Block | null = null;
    let lastIndex = -2;
    visit.stages.forEach((s, i) => {
      if (!s.laneIds.includes(laneId)) return;
      if (current && lastIndex === i - 1) {
        current.stages.push(s);
        current.end = Math.max(current.end, ms(s.end));
        current.plannedEnd = ms(s.plannedEnd);
      } else {
        current = { visit, stages: [s], start: ms(s.start), end: ms(s.end), plannedStart: ms(s.plannedStart), plannedEnd: ms(s.plannedEnd) };
        out.push(current);
      }
      lastIndex = i;
    });
  }
  return out;
}

function describe(block: Block, laneName: string, conflicted: string[]): string {
  const v = block.visit;
  const stageWords = block.stages.length === 1 ? block.stages[0].label : `${block.stages[0].label} to ${block.stages.at(-1)!.label}`;
  const shift = Math.round((block.end - block.plannedEnd) / MIN);
  const running = block.stages.find((s) => s.state === "running");
  return [
    `${v.initials}, tooth ${v.tooth.label}, ${v.material} ${v.mode}`,
    `${stageWords} on ${laneName}, ${clockAt(block.start, v.plannedStart)}–${clockAt(block.end, v.plannedStart)}`,
    shift !== 0 ? `ends ${shiftText(shift)} against the plan` : "on plan",
    running ? `${running.label} running` : STATUS_LABEL[v.status],
    ...conflicted.map((c) => `conflict: ${c}`),
  ].join("; ");
}

export function BoardLanes({ board }: { board: Board }) {
  const start = ms(board.window.start);
  const end = ms(board.window.end);
  const width = ((end - start) / MIN) * PX_PER_MIN;
  const x = (t: number) => ((Math.min(Math.max(t, start), end) - start) / MIN) * PX_PER_MIN;
  const ticks: { at: number; label: string | null }[] = [];
  for (let t = start; t <= end; t += 30 * MIN) {
    const label = clockAt(t, board.window.start);
    ticks.push({ at: t, label: label.endsWith(":00") ? label : null });
  }
  const now = ms(board.generatedAt);
  const nowX = board.isToday && now >= start && now <= end ? x(now) : null;
  const conflictsOf = (visitId: string, stages: BoardStage[]) =>
    board.conflicts.filter((c) => c.visitId === visitId && stages.some((s) => s.key === c.stageKey)).map((c) => c.message);

  const kinds = (["chair", "mill", "furnace"] as const).filter((k) => board.lanes.some((l) => l.kind === k));

  return (
    <div className="space-y-3">
      <div className="card overflow-x-auto p-0" data-testid="board-lanes">
        <div className="relative w-max">
          <div className="sticky top-0 flex border-b border-line bg-white" aria-hidden="true">
            <div className="sticky left-0 z-20 w-28 shrink-0 bg-white sm:w-44" />
            <div className="relative h-7" style={{ width }}>
              {ticks.map((t) => (
                <div key={t.at} className="absolute top-0 h-full border-l border-line" style={{ left: x(t.at) }}>
                  {t.label ? <span className="ml-1 text-xs text-ink-muted">{t.label}</span> : null}
                </div>
              ))}
            </div>
          </div>
          {kinds.map((kind) => (
            <div key={kind} role="group" aria-label={KIND_LABEL[kind]}>
              <div className="sticky left-0 z-10 w-28 bg-paper-deep px-3 py-1 text-xs font-bold uppercase tracking-wide text-ink-soft sm:w-44">{KIND_LABEL[kind]}</div>
              {board.lanes.filter((l) => l.kind === kind).map((lane) => (
                <div key={lane.id} className="flex border-b border-line" role="group" aria-labelledby={`lane-${lane.id}`} data-testid="board-lane" data-lane={lane.name}>
                  <div id={`lane-${lane.id}`} className="sticky left-0 z-10 flex w-28 shrink-0 items-center border-r border-line bg-white px-2 text-sm font-semibold sm:w-44 sm:px-3">
                    {lane.name}{lane.active ? "" : " (retired)"}
                  </div>
                  <div className="relative h-20" style={{ width }}>
                    {ticks.map((t) => <div key={t.at} aria-hidden="true" className="absolute top-0 h-full border-l border-paper-deep" style={{ left: x(t.at) }} />)}
                    {lane.outages.map((o) => (
                      <div
                        key={o.id}
                        className="absolute inset-y-1 overflow-hidden rounded border border-clay-600 px-1 text-xs font-semibold text-clay-700"
                        style={{ left: x(ms(o.start)), width: Math.max(x(ms(o.end)) - x(ms(o.start)), 4), background: "repeating-linear-gradient(135deg, #fbefe8 0 8px, #f5d6c6 8px 16px)" }}
                      >
                        Out of service {hhmm(o.start)}–{hhmm(o.end)}{o.reason ? ` · ${o.reason}` : ""}
                      </div>
                    ))}
                    {blocksOn(lane.id, board.visits).map((b) => {
                      const conflicts = conflictsOf(b.visit.id, b.stages);
                      const shift = Math.round((b.end - b.plannedEnd) / MIN);
                      const moved = b.start !== b.plannedStart || b.end !== b.plannedEnd;
                      const left = x(b.start);
                      const w = Math.max(x(b.end) - left, 8);
                      return (
                        <div key={`${b.visit.id}-${b.start}`}>
                          {moved ? (
                            <div aria-hidden="true" className="absolute inset-y-2 rounded border border-dashed border-ink-muted" style={{ left: x(b.plannedStart), width: Math.max(x(b.plannedEnd) - x(b.plannedStart), 8) }} />
                          ) : null}
                          <Link
                            href={`/clinic/visits/${b.visit.id}`}
                            aria-label={describe(b, lane.name, conflicts)}
                            title={describe(b, lane.name, conflicts)}
                            data-testid="board-block"
                            data-visit={b.visit.id}
                            data-conflict={conflicts.length > 0 ? "yes" : "no"}
                            className={`absolute inset-y-1 z-0 flex overflow-hidden rounded text-ink no-underline hover:no-underline focus-visible:z-10 ${conflicts.length ? "border-2 border-clay-600" : "border border-ink-muted"}`}
                            style={{ left, width: w, background: WAITING }}
                          >
                            {b.stages.map((s) => (
                              <span
                                key={s.key}
                                aria-hidden="true"
                                className={`absolute inset-y-0 border-r ${STATE_CLASS[s.state]}`}
                                style={{ left: x(ms(s.start)) - left, width: Math.max(x(ms(s.end)) - x(ms(s.start)), 1) }}
                              />
                            ))}
                            <span aria-hidden="true" className="relative m-0.5 self-start rounded-sm bg-white/85 px-1 text-xs leading-tight">
                              <span className="block font-bold">{conflicts.length ? "⚠ " : ""}{b.visit.initials} · {b.visit.tooth.fdi}</span>
                              <span className="block whitespace-nowrap">{b.stages.length === 1 ? b.stages[0].label : `${b.visit.material} · ${b.visit.mode}`}</span>
                              <span className="block whitespace-nowrap">{shift > 0 ? `${shift} min late` : shift < 0 ? `${-shift} min early` : STATUS_LABEL[b.visit.status]}</span>
                              {b.stages.length === 1 && b.stages[0].key === "fabrication" && b.stages[0].state === "planned" ? (
                                <span className="block whitespace-nowrap" data-testid="block-mark">{b.visit.block.loadedAt ? "✓ block loaded" : "block not loaded"}</span>
                              ) : null}
                            </span>
                          </Link>
                        </div>
                      );
                    })}
                    {nowX !== null ? (
                      <div aria-hidden="true" className="absolute top-0 z-10 h-full border-l-2 border-clay-700" style={{ left: nowX }} />
                    ) : null}
                  </div>
                </div>
              ))}
            </div>
          ))}
        </div>
      </div>
      <BoardLegend />
    </div>
  );
}

function BoardLegend() {
  const items = [
    { cls: STATE_CLASS.planned, label: STATE_LABEL.planned },
    { cls: STATE_CLASS.running, label: STATE_LABEL.running },
    { cls: STATE_CLASS.done, label: STATE_LABEL.done },
  ];
  return (
    <ul className="flex flex-wrap gap-4 text-sm text-ink-soft" aria-label="Legend">
      {items.map((i) => (
        <li key={i.label} className="flex items-center gap-2"><span aria-hidden="true" className={`inline-block h-4 w-6 rounded border ${i.cls}`} />{i.label} stage</li>
      ))}
      <li className="flex items-center gap-2"><span aria-hidden="true" className="inline-block h-4 w-6 rounded border border-ink-muted" style={{ background: WAITING }} />Waiting for a machine</li>
      <li className="flex items-center gap-2"><span aria-hidden="true" className="inline-block h-4 w-6 rounded border border-dashed border-ink-muted" />Planned position of a shifted visit</li>
      <li className="flex items-center gap-2"><span aria-hidden="true" className="inline-block h-4 w-6 rounded border-2 border-clay-600" />⚠ Conflict (see the list above)</li>
      <li className="flex items-center gap-2"><span aria-hidden="true" className="inline-block h-4 w-1 bg-clay-700" />Now</li>
    </ul>
  );
}
