import { useTranslations } from "next-intl";

/** The cautions line shown wherever clinical information appears. */
export function CautionsNote({ className = "" }: { className?: string }) {
  const t = useTranslations("common");
  return (
    <p className={`text-sm text-ink-muted ${className}`} data-testid="cautions-note">
      {t("cautions")}
    </p>
  );
}
