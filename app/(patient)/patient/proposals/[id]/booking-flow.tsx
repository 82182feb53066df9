"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { MODE_WORDS, money } from "@/lib/format";
import { visitLengthRange } from "@/lib/domain/timeline";
import type { Mode } from "@/lib/domain/types";
import { SlotPicker, type SlotOption } from "@/components/visits/slot-picker";

export type MaterialChoice = {
  id: string;
  feeCents: number;
  /** The patient's share after their dental-plan estimate; null without an estimate. */
  patientShareCents: number | null;
  name: string;
  description: string;
  pros: string[];
  cautions: string[];
  heatTreatment: string;
  provisionalOnly: boolean;
  modes: { mode: Mode; totalMinutes: number; finishing: string }[];
};

type Props = { proposalId: string; currency: string; timezone: string; choices: MaterialChoice[]; depositNote: string | null };

function lengthRange(c: MaterialChoice) {
  const mins = c.modes.map((m) => m.totalMinutes);
  const lo = Math.min(...mins);
  const hi = Math.max(...mins);
  // A rounded range around the estimates, as the consent states it.
  return visitLengthRange(lo, hi).text;
}

/** Proposal → material → mode → day and time → review → book, on one phone-sized page. */
export function BookingFlow({ proposalId, currency, timezone, choices, depositNote }: Props) {
  const router = useRouter();
  const [materialId, setMaterialId] = useState<string | null>(choices.length === 1 ? choices[0].id : null);
  const material = choices.find((c) => c.id === materialId) ?? null;
  const [mode, setMode] = useState<Mode | null>(null);
  const effectiveMode = material ? (material.modes.length === 1 ? material.modes[0].mode : mode) : null;
  const modeInfo = material?.modes.find((m) => m.mode === effectiveMode) ?? null;
  const [slot, setSlot] = useState<SlotOption | null>(null);
  const [submitting, setSubmitting] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [alternatives, setAlternatives] = useState<SlotOption[]>([]);

  async function book() {
    if (!material || !effectiveMode || !slot) return;
    setSubmitting(true);
    setError(null);
    const res = await fetch("/api/appointments", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ proposalId, materialId: material.id, mode: effectiveMode, start: slot.start }),
    });
    const body = await res.json().catch(() => ({}));
    setSubmitting(false);
    if (res.status === 201) {
      router.push(`/patient/visits/${body.id}`);
      router.refresh();
      return;
    }
    setError(body.error ?? "Booking did not work. Please try again.");
    setAlternatives(body.alternatives ?? []);
    if (res.status === 409) setSlot(null);
  }

  return (
    <div className="space-y-6">
      <fieldset className="space-y-3">
        <legend className="mb-2 text-lg font-semibold">1. Choose a material</legend>
        {choices.map((c) => (
          <label key={c.id} className={`card block cursor-pointer has-[:checked]:border-harbour-600 has-[:checked]:ring-2 has-[:checked]:ring-harbour-600`} data-testid="material-card">
            <span className="flex items-start gap-3">
              <input type="radio" name="material" value={c.id} checked={materialId === c.id} onChange={() => { setMaterialId(c.id); setMode(null); setSlot(null); }} className="mt-1.5 size-5 accent-harbour-600" />
              <span className="block flex-1">
                <span className="flex flex-wrap items-baseline justify-between gap-x-3">
                  <span className="block text-lg font-semibold">{c.name}</span>
                  <span className="block font-semibold" data-testid="material-fee">{money(c.feeCents, currency)}</span>
                </span>
                {c.patientShareCents !== null ? <span className="block text-sm text-ink-soft">Your share after your dental plan (estimate): {money(c.patientShareCents, currency)}</span> : null}
                <span className="block text-sm text-ink-soft">Visit {lengthRange(c)} · {c.heatTreatment === "sintering" ? "includes sintering in the furnace" : c.heatTreatment === "crystallisation" ? "includes a firing in the furnace" : c.modes.some((m) => m.finishing === "stain_glaze") ? "a furnace firing only for a glazed finish" : "no furnace time"}</span>
                <span className="mt-2 block">{c.description}</span>
                <span className="mt-2 grid gap-2 sm:grid-cols-2">
                  <span className="block">
                    <span className="block text-sm font-semibold text-sage-700">In its favour</span>
                    <span className="block"><ul className="list-disc pl-5 text-sm">{c.pros.map((p) => <li key={p}>{p}</li>)}</ul></span>
                  </span>
                  <span className="block">
                    <span className="block text-sm font-semibold text-clay-700">Cautions</span>
                    <span className="block"><ul className="list-disc pl-5 text-sm">{c.cautions.map((p) => <li key={p}>{p}</li>)}</ul></span>
                  </span>
                </span>
                {c.provisionalOnly ? <span className="mt-2 block text-sm font-semibold text-clay-700">Temporary crown only: a final crown is still needed.</span> : null}
              </span>
            </span>
          </label>
        ))}
        <p className="text-sm text-ink-soft">Each material has its own fee, set by your dentist. Your dentist confirms the choice with you at the visit.{choices.some((c) => c.patientShareCents !== null) ? " Shares after your dental plan are estimates; the plan's own decision prevails." : ""}</p>
      </fieldset>

      {material && material.modes.length > 1 ? (
        <fieldset className="space-y-2">
          <legend className="mb-2 text-lg font-semibold">2. Choose how it is finished</legend>
          {material.modes.map((m) => (
            <label key={m.mode} className="card flex cursor-pointer items-start gap-3 has-[:checked]:border-harbour-600 has-[:checked]:ring-2 has-[:checked]:ring-harbour-600">
              <input type="radio" name="mode" value={m.mode} checked={effectiveMode === m.mode} onChange={() => { setMode(m.mode); setSlot(null); }} className="mt-1.5 size-5 accent-harbour-600" />
              <span>
                <span className="block font-semibold">{MODE_WORDS[m.mode].name} · {visitLengthRange(m.totalMinutes).text}</span>
                <span className="block text-sm text-ink-soft">{MODE_WORDS[m.mode].blurb} {m.finishing === "stain_glaze" ? "Stained and glazed." : "Polished."}</span>
              </span>
            </label>
          ))}
        </fieldset>
      ) : material && modeInfo ? (
        <p className="card text-sm"><strong>{MODE_WORDS[modeInfo.mode].name} finish</strong> · {visitLengthRange(modeInfo.totalMinutes).text}. {MODE_WORDS[modeInfo.mode].blurb}</p>
      ) : null}

      {material && effectiveMode ? (
        <section className="space-y-3" aria-labelledby="when">
          <h2 id="when" className="text-lg font-semibold">{material.modes.length > 1 ? "3" : "2"}. Pick a day and start time</h2>
          <SlotPicker key={`${material.id}-${effectiveMode}`} proposalId={proposalId} materialId={material.id} mode={effectiveMode} timezone={timezone} selected={slot} onSelect={(s) => { setSlot(s); setError(null); }} />
        </section>
      ) : null}

      {error ? (
        <div role="alert" className="rounded-lg border border-clay-600 bg-clay-50 p-3 text-clay-700">
          <p className="font-semibold">{error}</p>
          {alternatives.length ? (
            <div className="mt-2 flex flex-wrap gap-2">
              {alternatives.map((a) => (
                <button key={a.start} type="button" className="btn-quiet" onClick={() => { setSlot(a); setError(null); setAlternatives([]); }}>
                  {a.start.slice(0, 10)} {a.start.slice(11, 16)}
                </button>
              ))}
            </div>
          ) : null}
        </div>
      ) : null}

      {material && modeInfo && slot ? (
        <section className="card space-y-2 border-harbour-600" aria-labelledby="review">
          <h2 id="review" className="text-lg font-semibold">Review</h2>
          <dl className="grid grid-cols-[7rem_1fr] gap-y-1 text-sm">
            <dt className="text-ink-muted">Material</dt><dd>{material.name}</dd>
            <dt className="text-ink-muted">Finish</dt><dd>{MODE_WORDS[modeInfo.mode].name}</dd>
            <dt className="text-ink-muted">Starts</dt><dd data-testid="review-start">{slot.label}</dd>
            <dt className="text-ink-muted">Length</dt><dd>{visitLengthRange(modeInfo.totalMinutes).text}; plan to stay the whole time</dd>
            <dt className="text-ink-muted">Fee</dt><dd>{money(material.feeCents, currency)}</dd>
            {material.patientShareCents !== null ? <><dt className="text-ink-muted">Your share</dt><dd>{money(material.patientShareCents, currency)} (estimate)</dd></> : null}
          </dl>
          {depositNote ? <p className="text-sm">{depositNote}</p> : null}
          <p className="text-sm text-ink-soft">The clinic confirms your request. Before the visit you answer health questions and sign consent here.</p>
          <button type="button" className="btn-primary w-full" onClick={book} disabled={submitting}>{submitting ? "Booking…" : "Request this visit"}</button>
        </section>
      ) : null}
    </div>
  );
}
