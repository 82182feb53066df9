import { useTranslations } from "next-intl";

// Our own palette; the words always carry the meaning, colour only supports them.
const TONE: Record<string, string> = {
  requested: "border-ochre-600 bg-ochre-50 text-ochre-700",
  confirmed: "border-sage-600 bg-sage-50 text-sage-700",
  checked_in: "border-harbour-600 bg-harbour-50 text-harbour-800",
  in_progress: "border-harbour-600 bg-harbour-50 text-harbour-800",
  completed: "border-line bg-paper-deep text-ink-soft",
  declined: "border-clay-600 bg-clay-50 text-clay-700",
  cancelled: "border-line bg-paper-deep text-ink-soft",
  no_show: "border-clay-600 bg-clay-50 text-clay-700",
};

export function StatusBadge({ status }: { status: string }) {
  const t = useTranslations("status");
  return <span className={`chip ${TONE[status] ?? "border-line"}`} data-testid="visit-status">{t.has(status) ? t(status as "confirmed") : status}</span>;
}
