import { useTranslations } from "next-intl";
import type { ConsentStatus } from "@/lib/domain/types";

// Our palette; the words carry the meaning and colour only supports them.
const STATUS: Record<ConsentStatus, { label: string; tone: string }> = {
  pending: { label: "Consent not signed yet", tone: "border-ochre-600 bg-ochre-50 text-ochre-700" },
  signed: { label: "Signed, waiting for review", tone: "border-harbour-600 bg-harbour-50 text-harbour-800" },
  reviewed: { label: "Signed and reviewed", tone: "border-sage-600 bg-sage-50 text-sage-700" },
  withdrawn: { label: "Withdrawn", tone: "border-clay-600 bg-clay-50 text-clay-700" },
};

export function ConsentStatusChip({ status }: { status: ConsentStatus }) {
  const s = STATUS[status];
  const t = useTranslations("consentStatus");
  return <span className={`chip ${s.tone}`} data-testid="consent-status">{t(status)}</span>;
}
