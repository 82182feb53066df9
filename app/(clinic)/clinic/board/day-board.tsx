"use client";

// The live day board: fetches /api/board for the chosen day and refreshes while the page is open
// (the state lives in PostgreSQL, so every screen polling it sees the same day).
import { useCallback, useEffect, useRef, useState } from "react";
import type { Board } from "@/lib/data/board";
import { BoardConflicts } from "./board-conflicts";
import { BoardLanes } from "./board-lanes";
import { BoardTable } from "./board-table";
import { addDays, hhmm, longDay } from "./board-format";

const REFRESH_MS = 15_000;

type Fetched = { ok: true; board: Board } | { ok: false; error: string };

async function fetchBoard(day: string | null): Promise<Fetched> {
  try {
    const res = await fetch(`/api/board${day ? `?day=${day}` : ""}`, { cache: "no-store" });
    const body = await res.json();
    return res.ok ? { ok: true, board: body as Board } : { ok: false, error: body.error ?? "The board could not be loaded." };
  } catch {
    return { ok: false, error: "The board could not be reached. It will try again shortly." };
  }
}

export function DayBoard({ initialDay }: { initialDay: string | null }) {
  const [day, setDay] = useState<string | null>(initialDay);
  const [board, setBoard] = useState<Board | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [view, setView] = useState<"lanes" | "table">("lanes");
  const wanted = useRef<string | null>(initialDay);

  const apply = useCallback((which: string | null, result: Fetched) => {
    if (wanted.current !== which) return; // a newer day was chosen meanwhile
    if (!result.ok) {
      setError(result.error);
      return;
    }
    setError(null);
    setBoard(result.board);
    if (!which) {
      wanted.current = result.board.day;
      setDay(result.board.day);
    }
  }, []);

  useEffect(() => {
    wanted.current = day;
    const refresh = () => fetchBoard(wanted.current).then((r) => apply(day, r));
    void refresh();
    const timer = setInterval(() => {
      if (document.visibilityState === "visible") void refresh();
    }, REFRESH_MS);
    const onVisible = () => document.visibilityState === "visible" && void refresh();
    document.addEventListener("visibilitychange", onVisible);
    return () => {
      clearInterval(timer);
      document.removeEventListener("visibilitychange", onVisible);
    };
  }, [day, apply]);

  const choose = (next: string) => {
    if (!/^\d{4}-\d{2}-\d{2}$/.test(next)) return;
    setBoard(null);
    setDay(next);
    window.history.replaceState(null, "", `?day=${next}`);
  };

  const shown = board && board.day === day ? board : null;

  return (
    <div className="space-y-4">
      <div className="card flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor="board-day" className="field-label">Day</label>
          <input id="board-day" type="date" className="field-input w-auto" value={day ?? ""} onChange={(e) => choose(e.target.value)} />
        </div>
        <div className="flex gap-2">
          <button type="button" className="btn-quiet" disabled={!day} onClick={() => day && choose(addDays(day, -1))}>Previous day</button>
          <button type="button" className="btn-quiet" disabled={!day} onClick={() => day && choose(addDays(day, 1))}>Next day</button>
        </div>
        <div className="ml-auto flex gap-2" role="group" aria-label="View">
          <button type="button" className={view === "lanes" ? "btn-primary" : "btn-quiet"} aria-pressed={view === "lanes"} onClick={() => setView("lanes")}>Lanes</button>
          <button type="button" className={view === "table" ? "btn-primary" : "btn-quiet"} aria-pressed={view === "table"} onClick={() => setView("table")}>Table</button>
        </div>
      </div>

      {error ? <p role="alert" className="rounded-lg bg-clay-50 p-3 text-sm font-medium text-clay-700">{error}</p> : null}

      {!shown ? (
        <p className="text-ink-soft" data-testid="board-loading">Loading the day…</p>
      ) : (
        <>
          <p className="text-sm text-ink-muted" data-testid="board-summary">
            <strong className="text-ink">{longDay(shown.day)}</strong> · {shown.visits.length} {shown.visits.length === 1 ? "visit" : "visits"} · times in {shown.timezone}
            {shown.isToday ? ` · updated ${hhmm(shown.generatedAt)}, refreshes every ${REFRESH_MS / 1000} s` : ""}
          </p>
          <BoardConflicts board={shown} />
          {shown.visits.length === 0 ? (
            <p className="card text-ink-soft">No visits on this day.</p>
          ) : view === "lanes" ? (
            <BoardLanes board={shown} />
          ) : (
            <BoardTable board={shown} />
          )}
        </>
      )}
    </div>
  );
}
