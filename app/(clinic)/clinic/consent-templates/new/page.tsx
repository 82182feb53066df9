import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser } from "@/lib/auth/session";
import { listTemplateVersions } from "@/lib/data/consents";
import { PLACEHOLDER_HELP, PLACEHOLDERS, SECTION_PURPOSE } from "@/lib/domain/consent-text";
import { DEFAULT_SECTIONS_FR, DEFAULT_TEMPLATE_TITLE_FR } from "@/lib/domain/consent-text-fr";
import { TemplateForm } from "./template-form";

export const metadata: Metadata = { title: "New consent text version" };

export default async function NewConsentTemplatePage() {
  const user = await requirePageUser(["admin"]);
  const { versions } = await listTemplateVersions({ user });
  const current = versions.find((v) => v.status === "published")!;
  return (
    <div className="mx-auto max-w-read space-y-5">
      <p><Link href="/clinic/consent-templates">← Consent texts</Link></p>
      <h1 className="text-2xl font-bold">Publish a new version</h1>
      <p>
        Starting from version {current.version}. When you publish, version {current.version} is replaced for new signatures;
        consents already signed keep their own text. Write in plain language, short sentences, one idea each.
      </p>
      <details className="card text-sm">
        <summary className="cursor-pointer font-semibold">How to write the text</summary>
        <ul className="mt-2 list-disc space-y-1 pl-5">
          <li>Leave a blank line between paragraphs.</li>
          <li>For a list, start each line with &ldquo;- &rdquo; and leave a blank line before and after it.</li>
          <li>Placeholders: {PLACEHOLDERS.map((p) => `{${p}} (${PLACEHOLDER_HELP[p]})`).join(", ")}.</li>
        </ul>
      </details>
      <TemplateForm
        initial={{ title: current.title, sections: current.sections, fr: { title: current.titleFr ?? DEFAULT_TEMPLATE_TITLE_FR, sections: current.sectionsFr ?? DEFAULT_SECTIONS_FR } }}
        purposes={SECTION_PURPOSE}
        nextVersion={versions[0].version + 1}
      />
    </div>
  );
}
