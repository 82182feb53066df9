/** The cautions line shown wherever clinical information appears. */
export function CautionsNote({ className = "" }: { className?: string }) {
  return (
    <p className={`text-sm text-ink-muted ${className}`} data-testid="cautions-note">
      Cuspal informs; your dentist decides. Everything here is confirmed with you chairside, and the dentist&apos;s
      judgment, local regulations and licensed practice prevail.
    </p>
  );
}
