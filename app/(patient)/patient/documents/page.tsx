import type { Metadata } from "next";
import { DocumentList } from "@/components/documents/document-list";
import { DocumentUpload } from "@/components/documents/document-upload";
import { requirePageUser } from "@/lib/auth/session";
import { listDocuments } from "@/lib/data/documents";
import { pageClientInfo } from "@/lib/documents/request-info";
import { kindsFor } from "@/lib/domain/documents";

export const metadata: Metadata = { title: "Documents" };

export default async function PatientDocumentsPage() {
  const user = await requirePageUser(["patient"]);
  const { documents, timeZone } = await listDocuments({ actor: user, client: await pageClientInfo() });
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-2xl font-bold">Your documents</h1>
        <p className="mt-2 max-w-read text-ink-soft">
          Send the clinic your insurance card, a referral letter, photos of the tooth or your list of medicines.
          Only you and the staff of your clinic can see them.
        </p>
      </div>
      <section className="card" aria-labelledby="add-document">
        <h2 id="add-document" className="mb-3 text-lg font-semibold">Add a document</h2>
        <DocumentUpload kinds={kindsFor("patient")} />
      </section>
      <section className="card" aria-labelledby="your-documents">
        <h2 id="your-documents" className="mb-1 text-lg font-semibold">Sent so far</h2>
        <DocumentList documents={documents} timeZone={timeZone} emptyText="You have not sent any documents yet." />
      </section>
    </div>
  );
}
