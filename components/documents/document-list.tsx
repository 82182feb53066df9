// The documents of one patient, newest first, with links that open or save each file through
// the access-checked route.
import { useLocale, useTranslations } from "next-intl";
import type { DocumentView } from "@/lib/data/documents";
import { ALLOWED_CONTENT } from "@/lib/domain/documents";
import { useSizeWords } from "./size-words";

export function DocumentList({ documents, timeZone, emptyText }: { documents: DocumentView[]; timeZone: string; emptyText: string }) {
  // Staff pages render in English (i18n/request.ts), so there these words stay English.
  const t = useTranslations("documentList");
  const locale = useLocale();
  const sizeWords = useSizeWords();
  if (documents.length === 0) return <p className="text-ink-soft">{emptyText}</p>;
  const when = new Intl.DateTimeFormat(locale === "fr" ? "fr-CA" : "en-GB", { dateStyle: "medium", timeStyle: "short", timeZone });
  return (
    <ul className="divide-y divide-line" data-testid="document-list">
      {documents.map((d) => (
        <li key={d.id} className="flex flex-col gap-2 py-3 sm:flex-row sm:items-center sm:justify-between">
          <div className="min-w-0">
            <p className="font-semibold break-words">{d.title}</p>
            <p className="text-sm text-ink-soft">
              <span className="chip border-harbour-600 bg-harbour-50 text-harbour-800">{t(`kinds.${d.kind}`)}</span>{" "}
              {t(`content.${ALLOWED_CONTENT[d.contentType].ext}`)}, {sizeWords(d.byteSize)}
            </p>
            <p className="text-sm text-ink-muted">
              {t.rich("addedBy", {
                you: d.uploadedBy.isYou ? "yes" : "no",
                who: d.uploadedBy.name,
                role: t(`roles.${d.uploadedBy.role}`),
                time: () => <time dateTime={d.createdAt}>{when.format(new Date(d.createdAt))}</time>,
              })}
            </p>
          </div>
          <div className="flex shrink-0 gap-2">
            {/* Only images open in the browser; an uploaded PDF is always saved (it could carry scripts). */}
            {ALLOWED_CONTENT[d.contentType].image && (
              <a className="btn-quiet" href={`/api/documents/${d.id}`}>
                {t("open")}<span className="sr-only"> {d.title}</span>
              </a>
            )}
            <a className="btn-quiet" href={`/api/documents/${d.id}?download=1`}>
              {t("download")}<span className="sr-only"> {d.title}</span>
            </a>
          </div>
        </li>
      ))}
    </ul>
  );
}
