"use client";

import { useRouter } from "next/navigation";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { money } from "@/lib/format";
import { visitLengthRange } from "@/lib/domain/timeline";
import type { Locale } from "@/lib/i18n/locale";
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

type Props = { locale: Locale; proposalId: string; currency: string; timezone: string; choices: MaterialChoice[]; depositNote: string | null };

function lengthRange(c: MaterialChoice, locale: Locale) {
  const mins = c.modes.map((m) => m.totalMinutes);
  const lo = Math.min(...mins);
  const hi = Math.max(...mins);
  // A rounded range around the estimates, as the consent states it.
  return visitLengthRange(lo, hi, locale).text;
}

/** Proposal → material → mode → day and time → review → book, on one phone-sized page. */
export function BookingFlow({ locale, proposalId, currency, timezone, choices, depositNote }: Props) {
  const router = useRouter();
  const t = useTranslations("booking");
  const tm = useTranslations("modes");
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
    setError(body.error ?? t("failed"));
    setAlternatives(body.alternatives ?? []);
    if (res.status === 409) setSlot(null);
  }

  return (
    <div className="space-y-6">
      <fieldset className="space-y-3">
        <legend className="mb-2 text-lg font-semibold">{t("chooseMaterial")}</legend>
        {choices.map((c) => (
          <label key={c.id} className={`card block cursor-pointer has-[:checked]:border-harbour-600 has-[:checked]:ring-2 has-[:checked]:ring-harbour-600`} data-testid="material-card">
            <span className="flex items-start gap-3">
              <input type="radio" name="material" value={c.id} checked={materialId === c.id} onChange={() => { setMaterialId(c.id); setMode(null); setSlot(null); }} className="mt-1.5 size-5 accent-harbour-600" />
              <span className="block flex-1">
                <span className="flex flex-wrap items-baseline justify-between gap-x-3">
                  <span className="block text-lg font-semibold">{c.name}</span>
                  <span className="block font-semibold" data-testid="material-fee">{money(c.feeCents, currency, locale)}</span>
                </span>
                {c.patientShareCents !== null ? <span className="block text-sm text-ink-soft">{t("shareAfterPlan", { share: money(c.patientShareCents, currency, locale) })}</span> : null}
                <span className="block text-sm text-ink-soft">{t("visitAbout", { length: lengthRange(c, locale) })} · {t("furnace", { heat: c.heatTreatment === "none" && c.modes.some((m) => m.finishing === "stain_glaze") ? "glazeOnly" : c.heatTreatment })}</span>
                <span className="mt-2 block">{c.description}</span>
                <span className="mt-2 grid gap-2 sm:grid-cols-2">
                  <span className="block">
                    <span className="block text-sm font-semibold text-sage-700">{t("pros")}</span>
                    <span className="block"><ul className="list-disc pl-5 text-sm">{c.pros.map((p) => <li key={p}>{p}</li>)}</ul></span>
                  </span>
                  <span className="block">
                    <span className="block text-sm font-semibold text-clay-700">{t("cautions")}</span>
                    <span className="block"><ul className="list-disc pl-5 text-sm">{c.cautions.map((p) => <li key={p}>{p}</li>)}</ul></span>
                  </span>
                </span>
                {c.provisionalOnly ? <span className="mt-2 block text-sm font-semibold text-clay-700">{t("provisionalOnly")}</span> : null}
              </span>
            </span>
          </label>
        ))}
        <p className="text-sm text-ink-soft">{t("feesNote")}{choices.some((c) => c.patientShareCents !== null) ? ` ${t("sharesAreEstimates")}` : ""}</p>
      </fieldset>

      {material && material.modes.length > 1 ? (
        <fieldset className="space-y-2">
          <legend className="mb-2 text-lg font-semibold">{t("chooseFinish")}</legend>
          {material.modes.map((m) => (
            <label key={m.mode} className="card flex cursor-pointer items-start gap-3 has-[:checked]:border-harbour-600 has-[:checked]:ring-2 has-[:checked]:ring-harbour-600">
              <input type="radio" name="mode" value={m.mode} checked={effectiveMode === m.mode} onChange={() => { setMode(m.mode); setSlot(null); }} className="mt-1.5 size-5 accent-harbour-600" />
              <span>
                <span className="block font-semibold">{t("modeLine", { mode: tm(`${m.mode}.name`), duration: visitLengthRange(m.totalMinutes, m.totalMinutes, locale).text })}</span>
                <span className="block text-sm text-ink-soft">{tm(`${m.mode}.blurb`)} {t("finishing", { finishing: m.finishing })}</span>
              </span>
            </label>
          ))}
        </fieldset>
      ) : material && modeInfo ? (
        <p className="card text-sm"><strong>{t("singleMode", { mode: tm(`${modeInfo.mode}.name`) })}</strong> · {visitLengthRange(modeInfo.totalMinutes, modeInfo.totalMinutes, locale).text}. {tm(`${modeInfo.mode}.blurb`)}</p>
      ) : null}

      {material && effectiveMode ? (
        <section className="space-y-3" aria-labelledby="when">
          <h2 id="when" className="text-lg font-semibold">{t("pickTime", { step: material.modes.length > 1 ? 3 : 2 })}</h2>
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
          <h2 id="review" className="text-lg font-semibold">{t("review")}</h2>
          <dl className="grid grid-cols-[7rem_1fr] gap-y-1 text-sm">
            <dt className="text-ink-muted">{t("material")}</dt><dd>{material.name}</dd>
            <dt className="text-ink-muted">{t("finish")}</dt><dd>{tm(`${modeInfo.mode}.name`)}</dd>
            <dt className="text-ink-muted">{t("starts")}</dt><dd data-testid="review-start">{slot.label}</dd>
            <dt className="text-ink-muted">{t("length")}</dt><dd>{t("lengthValue", { duration: visitLengthRange(modeInfo.totalMinutes, modeInfo.totalMinutes, locale).text })}</dd>
            <dt className="text-ink-muted">{t("fee")}</dt><dd>{money(material.feeCents, currency, locale)}</dd>
            {material.patientShareCents !== null ? <><dt className="text-ink-muted">{t("yourShare")}</dt><dd>{t("shareEstimate", { share: money(material.patientShareCents, currency, locale) })}</dd></> : null}
          </dl>
          {depositNote ? <p className="text-sm">{depositNote}</p> : null}
          <p className="text-sm text-ink-soft">{t("reviewNote")}</p>
          <button type="button" className="btn-primary w-full" onClick={book} disabled={submitting}>{submitting ? t("requesting") : t("request")}</button>
        </section>
      ) : null}
    </div>
  );
}
