import type { Metadata } from "next";
import { getTranslations } from "next-intl/server";
import { DocumentList } from "@/components/documents/document-list";
import { DocumentUpload } from "@/components/documents/document-upload";
import { requirePageUser } from "@/lib/auth/session";
import { listDocuments } from "@/lib/data/documents";
import { pageClientInfo } from "@/lib/documents/request-info";
import { kindsFor } from "@/lib/domain/documents";

export async function generateMetadata(): Promise<Metadata> {
  return { title: (await getTranslations("nav"))("documents") };
}

export default async function PatientDocumentsPage() {
  const user = await requirePageUser(["patient"]);
  const { documents, timeZone } = await listDocuments({ actor: user, client: await pageClientInfo() });
  const t = await getTranslations("documentsPage");
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-2xl font-bold">{t("heading")}</h1>
        <p className="mt-2 max-w-read text-ink-soft">{t("intro")}</p>
      </div>
      <section className="card" aria-labelledby="add-document">
        <h2 id="add-document" className="mb-3 text-lg font-semibold">{t("add")}</h2>
        <DocumentUpload kinds={kindsFor("patient")} />
      </section>
      <section className="card" aria-labelledby="your-documents">
        <h2 id="your-documents" className="mb-1 text-lg font-semibold">{t("sent")}</h2>
        <DocumentList documents={documents} timeZone={timeZone} emptyText={t("empty")} />
      </section>
    </div>
  );
}
