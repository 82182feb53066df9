import { useLocale, useTranslations } from "next-intl";
import { clock } from "@/lib/format";
import { isLocale } from "@/lib/i18n/locale";
import { stageWords } from "@/lib/i18n/stage-words";

export type TimelineView = {
  timezone: string;
  start: string;
  end: string;
  stages: { key: string; label: string; start: string; end: string; equipment: { kind: string; name: string }[] }[];
};

// Stage bars by what they need: our palette, always with the equipment named in text.
const BAR: Record<string, string> = { mill: "bg-ochre-600", furnace: "bg-clay-600", dentist: "bg-harbour-600", chair: "bg-ink-muted", none: "bg-line" };

function barTone(kinds: string[]) {
  return BAR[kinds.find((k) => k === "mill" || k === "furnace") ?? (kinds.includes("dentist") ? "dentist" : kinds[0] ?? "none")];
}

/** A visit's stages on a time axis, each labelled with its times and the equipment it holds. */
export function VisitTimeline({ timeline }: { timeline: TimelineView }) {
  const t = useTranslations("visit");
  const current = useLocale();
  const locale = isLocale(current) ? current : "en";
  const t0 = new Date(timeline.start).getTime();
  const span = new Date(timeline.end).getTime() - t0 || 1;
  return (
    <ol className="space-y-2" aria-label={t("timeline")} data-testid="visit-timeline">
      {timeline.stages.map((s) => {
        const left = ((new Date(s.start).getTime() - t0) / span) * 100;
        const width = Math.max(((new Date(s.end).getTime() - new Date(s.start).getTime()) / span) * 100, 1.5);
        const kinds = s.equipment.map((e) => e.kind);
        return (
          <li key={s.key} className="grid grid-cols-[4.5rem_1fr] items-start gap-2 sm:grid-cols-[5rem_12rem_1fr]">
            <span className="pt-0.5 text-sm tabular-nums text-ink-soft">{clock(s.start, timeline.timezone, locale)}–{clock(s.end, timeline.timezone, locale)}</span>
            <div className="sm:contents">
              <p className="text-sm font-semibold">{stageWords(s.label, locale)}</p>
              <div>
                <div className="relative h-3 rounded bg-paper-deep" aria-hidden="true">
                  <div className={`absolute inset-y-0 rounded ${barTone(kinds)}`} style={{ left: `${left}%`, width: `${width}%` }} />
                </div>
                <p className="mt-0.5 text-xs text-ink-muted">
                  {s.equipment.length ? s.equipment.map((e) => t("equipment", { kind: e.kind, name: e.name })).join(" · ") : t("noChair")}
                </p>
              </div>
            </div>
          </li>
        );
      })}
    </ol>
  );
}
