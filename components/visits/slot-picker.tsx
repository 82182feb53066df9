"use client";

import { useEffect, useState } from "react";
import { formatDay } from "@/lib/i18n/format";
import type { Locale } from "@/lib/i18n/locale";

export type SlotOption = { start: string; end: string; label: string };

/**
 * The picker's words, made by whoever renders it (`slotWords`, on the server or from a provider), so
 * the picker itself needs no message catalogue. `times` holds the literal `{day}`, filled in here.
 */
export type SlotWords = { zoneNote: string; loading: string; error: string; none: string; days: string; times: string; later: string };

type Props = {
  proposalId: string;
  materialId: string;
  mode: string;
  selected: SlotOption | null;
  words: SlotWords;
  locale: Locale;
  onSelect: (slot: SlotOption) => void;
  /** Where to fetch slots from; defaults to the proposal's availability API. */
  endpoint?: string;
};

const DAYS = 14;

function dayLabel(date: string, locale: Locale) {
  return formatDay(date, locale);
}

function nextDay(date: string) {
  const d = new Date(`${date}T12:00:00Z`);
  d.setUTCDate(d.getUTCDate() + 1);
  return d.toISOString().slice(0, 10);
}

/** Days with free start times, then the times of the chosen day. Times are shown as the
 *  clinic's wall clock (the API gives them with the clinic's offset). */
export function SlotPicker({ proposalId, materialId, mode, selected, onSelect, endpoint, words, locale }: Props) {
  const [slots, setSlots] = useState<{ start: string; end: string }[]>([]);
  const [from, setFrom] = useState<string | null>(null);
  const [lastDay, setLastDay] = useState<string | null>(null);
  const [day, setDay] = useState<string | null>(null);
  const [state, setState] = useState<"loading" | "ready" | "error">("loading");

  useEffect(() => {
    let cancelled = false;
    const params = new URLSearchParams({ materialId, mode, days: String(DAYS) });
    if (from) params.set("from", from);
    fetch(`${endpoint ?? `/api/proposals/${proposalId}/availability`}?${params}`)
      .then(async (res) => {
        const body = await res.json();
        if (!res.ok) throw new Error(body.error);
        if (cancelled) return;
        setSlots((prev) => (from ? [...prev, ...body.slots] : body.slots));
        const start = from ?? new Date().toISOString().slice(0, 10);
        let end = start;
        for (let i = 1; i < DAYS; i++) end = nextDay(end);
        setLastDay(end);
        setState("ready");
      })
      .catch(() => !cancelled && setState("error"));
    return () => {
      cancelled = true;
    };
  }, [proposalId, materialId, mode, from, endpoint]);

  const days = [...new Set(slots.map((s) => s.start.slice(0, 10)))];
  const activeDay = day ?? days[0] ?? null;
  const times = slots.filter((s) => s.start.slice(0, 10) === activeDay);

  return (
    <div className="space-y-3" data-testid="slot-picker">
      <p className="text-sm text-ink-soft">{words.zoneNote}</p>
      {state === "loading" && slots.length === 0 ? <p aria-live="polite">{words.loading}</p> : null}
      {state === "error" ? <p role="alert" className="text-clay-700">{words.error}</p> : null}
      {state === "ready" && slots.length === 0 ? <p>{words.none}</p> : null}
      {days.length ? (
        <div role="group" aria-label={words.days} className="-mx-1 flex gap-2 overflow-x-auto px-1 pb-1">
          {days.map((d) => (
            <button key={d} type="button" aria-pressed={d === activeDay} onClick={() => setDay(d)}
              className={`btn shrink-0 border ${d === activeDay ? "border-harbour-600 bg-harbour-600 text-white" : "border-line bg-white text-ink"}`}>
              {dayLabel(d, locale)}
            </button>
          ))}
        </div>
      ) : null}
      {times.length ? (
        <div role="group" aria-label={words.times.replace("{day}", activeDay ? dayLabel(activeDay, locale) : "")} className="grid grid-cols-3 gap-2 sm:grid-cols-5">
          {times.map((s) => {
            const label = `${dayLabel(s.start.slice(0, 10), locale)}, ${s.start.slice(11, 16)}`;
            const isSelected = selected?.start === s.start;
            return (
              <button key={s.start} type="button" aria-pressed={isSelected} onClick={() => onSelect({ ...s, label })}
                className={`btn border tabular-nums ${isSelected ? "border-harbour-600 bg-harbour-600 text-white" : "border-line bg-white text-ink"}`}>
                {s.start.slice(11, 16)}
              </button>
            );
          })}
        </div>
      ) : null}
      {state === "ready" && lastDay ? (
        <button type="button" className="btn-quiet" onClick={() => { setState("loading"); setFrom(nextDay(lastDay)); }}>{words.later}</button>
      ) : null}
    </div>
  );
}
