import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { findClinicPatient, type PatientSummary } from "@/lib/data/patient-directory";
import { AppError } from "@/lib/server/errors";
import { PatientDocuments } from "./patient-documents";
import { PatientBlocks } from "./patient-blocks";
import { LOCALE_ENGLISH_NAMES } from "@/lib/i18n/locale";

export const metadata: Metadata = { title: "Patient" };

export default async function PatientPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser(STAFF_ROLES);
  const { id } = await params;
  let patient: PatientSummary;
  try {
    patient = await findClinicPatient({ clinicId: user.clinicId!, patientId: id });
  } catch (err) {
    if (err instanceof AppError && err.status === 404) notFound();
    throw err;
  }
  return (
    <div className="space-y-6">
      <div>
        <Link href="/clinic/patients" className="text-sm">← All patients</Link>
        <h1 className="mt-1 text-2xl font-bold">{patient.name}</h1>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-muted">E-mail</dt>
          <dd>{patient.email}</dd>
          {patient.dateOfBirth ? (<><dt className="text-ink-muted">Date of birth</dt><dd>{patient.dateOfBirth}</dd></>) : null}
          <dt className="text-ink-muted">Language</dt><dd data-testid="patient-language">{LOCALE_ENGLISH_NAMES[patient.language]}</dd>
          {patient.phone ? (<><dt className="text-ink-muted">Phone</dt><dd>{patient.phone}</dd></>) : null}
        </dl>
      </div>
      <PatientDocuments patientId={patient.id} />
      <PatientBlocks clinicId={user.clinicId!} patientId={patient.id} />
    </div>
  );
}
