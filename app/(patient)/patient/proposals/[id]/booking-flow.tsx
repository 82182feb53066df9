"use client";
// Every word and figure arrives ready from the server (proposal page): the browser gets the
// choosing, the slot picker and the request, but no message catalogue or formatting library.
import { useRouter } from "next/navigation";
import { useState } from "react";
import type { Locale } from "@/lib/i18n/locale";
import type { Mode } from "@/lib/domain/types";
import { SlotPicker, type SlotOption, type SlotWords } from "@/components/visits/slot-picker";

export type ModeChoice = {
  mode: Mode;
  /** "Standard", the finish's name. */
  name: string;
  /** "Standard · about 2 h 30 min to 3 h" for the list of finishes. */
  line: string;
  /** The finish's blurb and how the crown is finished. */
  detail: string;
  /** The line shown when this is the material's only finish: its title ("Standard finish"), then the rest. */
  singleTitle: string;
  singleRest: string;
  /** The visit's length for the review: "about …; plan to stay the whole time". */
  lengthValue: string;
};

export type MaterialChoice = {
  id: string;
  name: string;
  feeText: string;
  /** "Your share after your dental plan (estimate): …"; null without an estimate. */
  shareLine: string | null;
  /** The share for the review ("… (estimate)"); null without an estimate. */
  shareText: string | null;
  /** "Visit about … · includes a firing in the furnace" */
  visitLine: string;
  /** The heading of the time step, numbered for this material (2 or 3). */
  pickTime: string;
  description: string;
  pros: string[];
  cautions: string[];
  provisionalOnly: boolean;
  modes: ModeChoice[];
};

export type BookingWords = {
  chooseMaterial: string; pros: string; cautions: string; provisionalOnly: string; feesNote: string; chooseFinish: string;
  review: string; material: string; finish: string; starts: string; length: string; fee: string; yourShare: string;
  reviewNote: string; request: string; requesting: string; failed: string; slots: SlotWords;
};

type Props = { locale: Locale; proposalId: string; choices: MaterialChoice[]; depositNote: string | null; words: BookingWords };

/** Proposal → material → mode → day and time → review → book, on one phone-sized page. */
export function BookingFlow({ locale, proposalId, choices, depositNote, words }: Props) {
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
    setError(body.error ?? words.failed);
    setAlternatives(body.alternatives ?? []);
    if (res.status === 409) setSlot(null);
  }

  return (
    <div className="space-y-6">
      <fieldset className="space-y-3">
        <legend className="mb-2 text-lg font-semibold">{words.chooseMaterial}</legend>
        {choices.map((c) => (
          <label key={c.id} className={`card block cursor-pointer has-[:checked]:border-harbour-600 has-[:checked]:ring-2 has-[:checked]:ring-harbour-600`} data-testid="material-card">
            <span className="flex items-start gap-3">
              <input type="radio" name="material" value={c.id} checked={materialId === c.id} onChange={() => { setMaterialId(c.id); setMode(null); setSlot(null); }} className="mt-1.5 size-5 accent-harbour-600" />
              <span className="block flex-1">
                <span className="flex flex-wrap items-baseline justify-between gap-x-3">
                  <span className="block text-lg font-semibold">{c.name}</span>
                  <span className="block font-semibold" data-testid="material-fee">{c.feeText}</span>
                </span>
                {c.shareLine !== null ? <span className="block text-sm text-ink-soft">{c.shareLine}</span> : null}
                <span className="block text-sm text-ink-soft">{c.visitLine}</span>
                <span className="mt-2 block">{c.description}</span>
                <span className="mt-2 grid gap-2 sm:grid-cols-2">
                  <span className="block">
                    <span className="block text-sm font-semibold text-sage-700">{words.pros}</span>
                    <span className="block"><ul className="list-disc pl-5 text-sm">{c.pros.map((p) => <li key={p}>{p}</li>)}</ul></span>
                  </span>
                  <span className="block">
                    <span className="block text-sm font-semibold text-clay-700">{words.cautions}</span>
                    <span className="block"><ul className="list-disc pl-5 text-sm">{c.cautions.map((p) => <li key={p}>{p}</li>)}</ul></span>
                  </span>
                </span>
                {c.provisionalOnly ? <span className="mt-2 block text-sm font-semibold text-clay-700">{words.provisionalOnly}</span> : null}
              </span>
            </span>
          </label>
        ))}
        <p className="text-sm text-ink-soft">{words.feesNote}</p>
      </fieldset>

      {material && material.modes.length > 1 ? (
        <fieldset className="space-y-2">
          <legend className="mb-2 text-lg font-semibold">{words.chooseFinish}</legend>
          {material.modes.map((m) => (
            <label key={m.mode} className="card flex cursor-pointer items-start gap-3 has-[:checked]:border-harbour-600 has-[:checked]:ring-2 has-[:checked]:ring-harbour-600">
              <input type="radio" name="mode" value={m.mode} checked={effectiveMode === m.mode} onChange={() => { setMode(m.mode); setSlot(null); }} className="mt-1.5 size-5 accent-harbour-600" />
              <span>
                <span className="block font-semibold">{m.line}</span>
                <span className="block text-sm text-ink-soft">{m.detail}</span>
              </span>
            </label>
          ))}
        </fieldset>
      ) : material && modeInfo ? (
        <p className="card text-sm"><strong>{modeInfo.singleTitle}</strong>{modeInfo.singleRest}</p>
      ) : null}

      {material && effectiveMode ? (
        <section className="space-y-3" aria-labelledby="when">
          <h2 id="when" className="text-lg font-semibold">{material.pickTime}</h2>
          <SlotPicker key={`${material.id}-${effectiveMode}`} proposalId={proposalId} materialId={material.id} mode={effectiveMode} words={words.slots} locale={locale} selected={slot} onSelect={(s) => { setSlot(s); setError(null); }} />
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
          <h2 id="review" className="text-lg font-semibold">{words.review}</h2>
          <dl className="grid grid-cols-[7rem_1fr] gap-y-1 text-sm">
            <dt className="text-ink-muted">{words.material}</dt><dd>{material.name}</dd>
            <dt className="text-ink-muted">{words.finish}</dt><dd>{modeInfo.name}</dd>
            <dt className="text-ink-muted">{words.starts}</dt><dd data-testid="review-start">{slot.label}</dd>
            <dt className="text-ink-muted">{words.length}</dt><dd>{modeInfo.lengthValue}</dd>
            <dt className="text-ink-muted">{words.fee}</dt><dd>{material.feeText}</dd>
            {material.shareText !== null ? <><dt className="text-ink-muted">{words.yourShare}</dt><dd>{material.shareText}</dd></> : null}
          </dl>
          {depositNote ? <p className="text-sm">{depositNote}</p> : null}
          <p className="text-sm text-ink-soft">{words.reviewNote}</p>
          <button type="button" className="btn-primary w-full" onClick={book} disabled={submitting}>{submitting ? words.requesting : words.request}</button>
        </section>
      ) : null}
    </div>
  );
}
