import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser } from "@/lib/auth/session";
import { listTemplateVersions } from "@/lib/data/consents";
import { PLACEHOLDER_HELP, PLACEHOLDERS } from "@/lib/domain/consent-text";
import { when } from "@/lib/format";

export const metadata: Metadata = { title: "Consent texts" };

/** The clinic manager's view of the consent text versions: the one in use and every earlier one. */
export default async function ConsentTemplatesPage({ searchParams }: { searchParams: Promise<{ published?: string }> }) {
  const user = await requirePageUser(["admin"]);
  const { published } = await searchParams;
  const { versions, timeZone } = await listTemplateVersions({ user });
  const current = versions.find((v) => v.status === "published");

  return (
    <div className="space-y-5">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-bold">Consent texts</h1>
          <p className="max-w-read text-ink-soft">
            Patients read and sign the version in use. A version never changes once published: editing publishes a new
            version, and consents already signed keep the text they were signed with.
          </p>
        </div>
        <Link href="/clinic/consent-templates/new" className="btn-primary">Edit and publish a new version</Link>
      </header>
      {published ? <p role="status" className="rounded-lg border-l-4 border-sage-600 bg-sage-50 p-3 font-medium text-sage-700">Version {published} is published and in use.</p> : null}

      <section className="card overflow-x-auto" aria-labelledby="versions-heading">
        <h2 id="versions-heading" className="mb-2 text-lg font-semibold">Versions</h2>
        <table className="w-full text-left text-sm">
          <thead>
            <tr className="border-b border-line">
              <th scope="col" className="py-2 pr-3">Version</th>
              <th scope="col" className="py-2 pr-3">Title</th>
              <th scope="col" className="py-2 pr-3">State</th>
              <th scope="col" className="py-2 pr-3">Published</th>
              <th scope="col" className="py-2">Consents on it</th>
            </tr>
          </thead>
          <tbody>
            {versions.map((v) => (
              <tr key={v.id} className="border-b border-line last:border-0" data-testid="template-version">
                <td className="py-2 pr-3 font-semibold">{v.version}</td>
                <td className="py-2 pr-3">{v.title}</td>
                <td className="py-2 pr-3">{v.status === "published" ? <span className="chip border-sage-600 bg-sage-50 text-sage-700">In use</span> : <span className="chip border-line bg-paper-deep text-ink-soft">Replaced</span>}</td>
                <td className="py-2 pr-3">{when(v.publishedAt, timeZone)}</td>
                <td className="py-2">{v.signedCount}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      {current ? (
        <section className="card space-y-4" aria-labelledby="current-heading">
          <h2 id="current-heading" className="text-lg font-semibold">Version {current.version} in use: {current.title}</h2>
          {current.sections.map((s) => (
            <div key={s.key}>
              <h3 className="font-semibold">{s.heading}</h3>
              <p className="whitespace-pre-line text-sm text-ink-soft">{s.body}</p>
            </div>
          ))}
          <p className="text-sm text-ink-muted">
            Placeholders filled in for each visit: {PLACEHOLDERS.map((p) => `{${p}} ${PLACEHOLDER_HELP[p]}`).join("; ")}.
            The chosen material&apos;s cautions are added under the material section.
          </p>
        </section>
      ) : null}
    </div>
  );
}
