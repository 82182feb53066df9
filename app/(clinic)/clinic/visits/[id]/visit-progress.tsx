"use client";

// Chairside progress: staff start and finish the visit's stages; the projection (and any knock-on
// on other visits sharing the mill or furnace) comes back from the day board's computation.
import { useRouter } from "next/navigation";
import { useCallback, useEffect, useState } from "react";
import type { VisitProgress as Progress } from "@/lib/data/progress";

const REFRESH_MS = 20_000;

type Fetched = { ok: true; data: Progress } | { ok: false; error: string };

async function fetchProgress(visitId: string): Promise<Fetched> {
  const res = await fetch(`/api/appointments/${visitId}/stages`, { cache: "no-store" }).catch(() => null);
  if (!res) return { ok: false, error: "Progress could not be loaded. It will try again shortly." };
  const body = await res.json().catch(() => ({}));
  return res.ok ? { ok: true, data: body as Progress } : { ok: false, error: body.error ?? "Progress could not be loaded." };
}
const hhmm = (iso: string | null) => (iso ? iso.slice(11, 16) : "—");
const STATUS = { requested: "Requested", confirmed: "Confirmed", checked_in: "Checked in", in_progress: "In progress", completed: "Completed" } as Record<string, string>;

export function VisitProgress({ visitId, canMark }: { visitId: string; canMark: boolean }) {
  const router = useRouter();
  const [data, setData] = useState<Progress | null>(null);
  const [loadError, setLoadError] = useState<string | null>(null);
  const [actionError, setActionError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [held, setHeld] = useState<string | null>(null);
  const [time, setTime] = useState("");
  const [busy, setBusy] = useState(false);

  const load = useCallback(
    () =>
      fetchProgress(visitId).then((r) => {
        if (r.ok) {
          setLoadError(null);
          setData(r.data);
        } else setLoadError(r.error);
      }),
    [visitId],
  );

  useEffect(() => {
    const refresh = () => fetchProgress(visitId).then((r) => (r.ok ? (setLoadError(null), setData(r.data)) : setLoadError(r.error)));
    void refresh();
    const timer = setInterval(() => document.visibilityState === "visible" && void refresh(), REFRESH_MS);
    return () => clearInterval(timer);
  }, [visitId]);

  if (!data) {
    return loadError ? <p className="text-ink-soft">{loadError}</p> : <p className="text-ink-soft">Loading progress…</p>;
  }

  const stages = data.visit.stages.filter((s) => data.tracked.includes(s.key));
  const nextIndex = stages.findIndex((s) => s.actualEnd === null);
  const next = nextIndex === -1 ? null : stages[nextIndex];
  const action = next ? (next.actualStart === null ? "start" : "finish") : null;
  const markable = canMark && ["confirmed", "checked_in", "in_progress"].includes(data.status);
  const offset = data.visit.plannedStart.slice(19);

  const mark = async () => {
    if (!next || !action) return;
    setBusy(true);
    setActionError(null);
    setDone(null);
    setHeld(null);
    const at = time ? `${data.day}T${time}:00${offset}` : undefined;
    const res = await fetch(`/api/appointments/${visitId}/stages/${next.key}`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ action, ...(at ? { at } : {}) }),
    }).catch(() => null);
    const body = res ? await res.json().catch(() => ({})) : {};
    setBusy(false);
    if (!res || !res.ok) {
      setActionError(body.error ?? "That did not work. Please try again.");
      return;
    }
    const recorded: string = action === "start" ? body.stage.actualStart : body.stage.actualEnd;
    setDone(`${next.label} ${action === "start" ? "started" : "finished"} at ${hhmm(toClinic(recorded, offset))}.`);
    // Holds that could not follow the new times because another visit has the machine or the dentist then.
    const stuck = (body.replan?.conflicts ?? []) as { stage: string; resourceKind: string }[];
    if (stuck.length) setHeld(`${stuck.length} hold${stuck.length === 1 ? "" : "s"} of this visit could not move (${stuck.map((c) => `${c.stage.replace("_", " ")} on the ${c.resourceKind}`).join(", ")}): another visit has it then. Check the day board and tell reception.`);
    setTime("");
    await load();
    router.refresh();
  };

  return (
    <div className="space-y-3" data-testid="visit-progress">
      <p className="text-sm text-ink-soft" data-testid="progress-summary">
        <span className="font-semibold text-ink">{STATUS[data.status] ?? data.status}</span> · planned {hhmm(data.visit.plannedStart)}–{hhmm(data.visit.plannedEnd)} ·
        {" "}{data.status === "completed" ? "finished" : "ends about"} {hhmm(data.visit.projectedEnd)}
        {data.visit.delayMinutes > 0 ? ` (${data.visit.delayMinutes} min late)` : data.visit.delayMinutes < 0 ? ` (${-data.visit.delayMinutes} min early)` : " (on time)"}
      </p>

      {data.conflicts.length > 0 ? (
        <ul className="space-y-2 rounded-lg border-2 border-clay-600 bg-clay-50 p-3 text-sm" data-testid="progress-conflicts">
          {data.conflicts.map((c) => (
            <li key={`${c.visitId}-${c.stageKey}`}>
              <span className="font-semibold">{c.visitId === data.id ? "⚠ This visit: " : "⚠ Knock-on for another visit: "}</span>{c.message} <span className="text-ink-soft">Proposal: {c.proposal}</span>
            </li>
          ))}
        </ul>
      ) : null}

      <ol className="divide-y divide-line rounded-lg border border-line" aria-label="Stages">
        {stages.map((s, i) => {
          const state = s.actualEnd ? "Done" : s.actualStart ? "Running" : i === nextIndex ? "Next" : "To come";
          const chip = { Done: "border-sage-600 bg-sage-50 text-sage-700", Running: "border-ochre-600 bg-ochre-50 text-ochre-700", Next: "border-harbour-600 bg-harbour-50 text-harbour-700", "To come": "border-line bg-white text-ink-soft" }[state];
          return (
            <li key={s.key} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2" data-testid="progress-stage" data-stage={s.key} data-state={state}>
              <span>
                <span className="font-semibold">{s.label}</span>
                <span className="block text-sm text-ink-soft">
                  planned {hhmm(s.plannedStart)}–{hhmm(s.plannedEnd)}
                  {s.actualStart ? ` · started ${hhmm(s.actualStart)}` : ""}
                  {s.actualEnd ? ` · finished ${hhmm(s.actualEnd)}` : ""}
                  {!s.actualEnd && s.shiftMinutes !== 0 ? ` · expected ${hhmm(s.start)}–${hhmm(s.end)}` : ""}
                </span>
              </span>
              <span className={`chip ${chip}`}>{state}</span>
            </li>
          );
        })}
      </ol>

      {done ? <p role="status" className="rounded-lg bg-sage-50 p-3 text-sm font-medium text-sage-700" data-testid="progress-done">{done}</p> : null}
      {held ? <p role="alert" className="rounded-lg bg-clay-50 p-3 text-sm font-medium text-clay-700" data-testid="replan-conflict">{held}</p> : null}
      {actionError ? <p role="alert" className="rounded-lg bg-clay-50 p-3 text-sm font-medium text-clay-700" data-testid="progress-error">{actionError}</p> : null}

      {markable && next && action ? (
        <form
          className="flex flex-wrap items-end gap-3 rounded-lg bg-paper-deep p-3"
          onSubmit={(e) => {
            e.preventDefault();
            void mark();
          }}
        >
          <div>
            <label htmlFor="stage-time" className="field-label">Time (clinic time)</label>
            <input id="stage-time" type="time" className="field-input w-36" value={time} onChange={(e) => setTime(e.target.value)} aria-describedby="stage-time-hint" />
            <p id="stage-time-hint" className="mt-1 text-xs text-ink-muted">Leave empty for now; fill in when recording it afterwards.</p>
          </div>
          <button type="submit" className="btn-primary" disabled={busy}>
            {action === "start" ? "Start" : "Finish"} {next.label.toLowerCase()}
          </button>
        </form>
      ) : data.status === "completed" ? (
        <p className="text-sm text-ink-soft" data-testid="completion-record">
          Completion record: every stage above with the times staff recorded, and the blocks used below. It is kept in the visit&apos;s audit trail.
        </p>
      ) : null}
    </div>
  );
}

/** An instant (UTC ISO from the server) as clinic wall-clock ISO, using the visit's offset. */
function toClinic(utcIso: string, offset: string): string {
  const sign = offset.startsWith("-") ? -1 : 1;
  const [h, m] = offset.slice(1).split(":").map(Number);
  return new Date(Date.parse(utcIso) + sign * (h * 60 + m) * 60_000).toISOString();
}
