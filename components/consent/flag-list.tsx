import type { ConsentFlag } from "@/lib/domain/consent-questionnaire";

/** Health flags for staff: alerts first, each with its level written out, never colour alone. */
export function FlagList({ flags, compact = false }: { flags: ConsentFlag[]; compact?: boolean }) {
  if (flags.length === 0) return <p className="text-sm text-ink-soft" data-testid="no-flags">No health points flagged.</p>;
  if (compact) {
    return (
      <ul className="flex flex-wrap gap-1" aria-label="Health flags">
        {flags.map((f) => (
          <li key={f.key} className={`chip ${f.level === "alert" ? "border-clay-600 bg-clay-50 text-clay-700" : "border-ochre-600 bg-ochre-50 text-ochre-700"}`}>
            {f.level === "alert" ? "Alert" : "Check"}: {f.label}
          </li>
        ))}
      </ul>
    );
  }
  return (
    <ul className="space-y-2" data-testid="flag-list">
      {flags.map((f) => (
        <li
          key={f.key}
          className={`rounded-lg border-l-4 p-3 ${f.level === "alert" ? "border-clay-600 bg-clay-50" : "border-ochre-600 bg-ochre-50"}`}
          data-testid={`flag-${f.key}`}
        >
          <p className="font-semibold">
            <span className={f.level === "alert" ? "text-clay-700" : "text-ochre-700"}>{f.level === "alert" ? "Alert" : "Check"}:</span> {f.label}
          </p>
          {f.detail ? <p className="text-sm text-ink-soft">{f.detail}</p> : null}
        </li>
      ))}
    </ul>
  );
}
