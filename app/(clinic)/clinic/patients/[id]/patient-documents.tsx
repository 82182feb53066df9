// The documents section of the staff patient page: the patient's documents and a staff upload.
import { DocumentList } from "@/components/documents/document-list";
import { DocumentUpload } from "@/components/documents/document-upload";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { listDocuments } from "@/lib/data/documents";
import { pageClientInfo } from "@/lib/documents/request-info";
import { kindsFor } from "@/lib/domain/documents";

export async function PatientDocuments({ patientId }: { patientId: string }) {
  const user = await requirePageUser(STAFF_ROLES);
  const { documents, timeZone } = await listDocuments({ actor: user, patientId, client: await pageClientInfo() });
  return (
    <section className="card space-y-4" aria-labelledby="patient-documents">
      <h2 id="patient-documents" className="text-lg font-semibold">Documents</h2>
      <DocumentList documents={documents} timeZone={timeZone} emptyText="No documents for this patient yet." />
      <details className="rounded-lg border border-line p-3">
        <summary className="min-h-6 cursor-pointer font-semibold">Upload a document for this patient</summary>
        <div className="mt-3">
          <DocumentUpload kinds={kindsFor(user.role)} patientId={patientId} />
        </div>
      </details>
    </section>
  );
}
