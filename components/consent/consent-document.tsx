import type { AssembledConsent, AssembledSection } from "@/lib/domain/consent-text";

export function SectionBody({ section }: { section: AssembledSection }) {
  return (
    <div className="space-y-2">
      {section.blocks.map((b, i) =>
        b.kind === "p" ? <p key={i}>{b.text}</p> : (
          <ul key={i} className="list-disc space-y-1 pl-5">{b.items.map((item) => <li key={item}>{item}</li>)}</ul>
        ),
      )}
    </div>
  );
}

export function VisitRows({ rows }: { rows: AssembledConsent["visit"] }) {
  return (
    <dl className="grid grid-cols-[7.5rem_1fr] gap-x-2 gap-y-1 text-sm">
      {rows.map((r) => (
        <div key={r.label} className="contents">
          <dt className="text-ink-muted">{r.label}</dt>
          <dd>{r.value}</dd>
        </div>
      ))}
    </dl>
  );
}

/** A whole consent as read-only text (what was signed). */
export function ConsentDocument({ doc }: { doc: AssembledConsent }) {
  return (
    <div className="space-y-4">
      <p className="text-sm text-ink-muted">{doc.title} · consent text version {doc.templateVersion}</p>
      <VisitRows rows={doc.visit} />
      {doc.sections.map((s) => (
        <section key={s.key} aria-labelledby={`signed-${s.key}`} className="space-y-1">
          <h3 id={`signed-${s.key}`} className="font-semibold">{s.heading}</h3>
          <SectionBody section={s} />
        </section>
      ))}
      <section aria-labelledby="signed-records" className="space-y-1">
        <h3 id="signed-records" className="font-semibold">{doc.electronicRecords.heading}</h3>
        {doc.electronicRecords.text.map((t) => <p key={t}>{t}</p>)}
      </section>
    </div>
  );
}
