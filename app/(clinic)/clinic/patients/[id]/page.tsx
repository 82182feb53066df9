import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { getPatientDetails, patientSchemaContext, type PatientDetails } from "@/lib/data/patients";
import { displayPhone, LANGUAGE_NAMES } from "@/lib/domain/patient-record";
import { formatLocal } from "@/lib/domain/time-zone";
import { AppError } from "@/lib/server/errors";
import { EditDetailsForm } from "./edit-details-form";
import { ArchiveButton, InviteButton } from "./patient-actions";
import { PatientDocuments } from "./patient-documents";
import { PatientBlocks } from "./patient-blocks";

export const metadata: Metadata = { title: "Patient" };

export default async function PatientPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser(STAFF_ROLES);
  const { id } = await params;
  let patient: PatientDetails;
  try {
    patient = await getPatientDetails({ user, patientId: id });
  } catch (err) {
    if (err instanceof AppError && err.status === 404) notFound();
    throw err;
  }
  const { country, today, timeZone } = await patientSchemaContext({ clinicId: user.clinicId! });
  const inv = patient.invitation;
  const invitationText =
    inv.state === "signed_in" ? `Signed in: first ${formatLocal(inv.firstAt, timeZone)}, last ${formatLocal(inv.at, timeZone)}`
      : inv.state === "invited" ? `Invited ${formatLocal(inv.at, timeZone)}; not signed in yet (link valid until ${formatLocal(inv.expiresAt, timeZone)})`
        : "Not invited yet";
  return (
    <div className="space-y-6">
      <div>
        <Link href="/clinic/patients" className="text-sm">← All patients</Link>
        <h1 className="mt-1 text-2xl font-bold">{patient.name}{patient.archived ? <span className="ml-2 align-middle text-sm font-normal text-ink-muted">(archived)</span> : null}</h1>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-muted">E-mail</dt>
          <dd>{patient.email}</dd>
          {patient.dateOfBirth ? (<><dt className="text-ink-muted">Date of birth</dt><dd>{patient.dateOfBirth}</dd></>) : null}
          {patient.phone ? (<><dt className="text-ink-muted">Phone</dt><dd>{displayPhone(patient.phone, country)}</dd></>) : null}
          <dt className="text-ink-muted">Language</dt>
          <dd data-testid="patient-language">{LANGUAGE_NAMES[patient.language]}</dd>
          <dt className="text-ink-muted">Reminders</dt>
          <dd>{patient.reminders ? "By e-mail" : "Off"}</dd>
          {patient.address ? (<><dt className="text-ink-muted">Address</dt><dd className="whitespace-pre-line">{patient.address}</dd></>) : null}
          <dt className="text-ink-muted">Portal</dt>
          <dd data-testid="invitation-state">{invitationText}</dd>
        </dl>
      </div>
      <section className="card flex flex-wrap items-start gap-4" aria-label="Actions">
        {patient.archived ? null : <InviteButton patientId={patient.id} again={inv.state !== "not_invited"} />}
        {!patient.archived && (user.role === "dentist" || user.role === "admin") ? (
          <Link href={`/clinic/proposals/new?patient=${patient.id}`} className="btn-quiet">Propose a crown</Link>
        ) : null}
        <ArchiveButton patientId={patient.id} archived={patient.archived} />
      </section>
      <details className="card">
        <summary className="cursor-pointer font-semibold">Correct details</summary>
        <div className="mt-3">
          <EditDetailsForm
            patientId={patient.id}
            country={country}
            today={today}
            initial={{
              name: patient.name, email: patient.email, dateOfBirth: patient.dateOfBirth ?? "", phone: patient.phone ? displayPhone(patient.phone, country) : "",
              language: patient.language, address: patient.address ?? "", reminders: patient.reminders,
            }}
          />
        </div>
      </details>
      <PatientDocuments patientId={patient.id} />
      <PatientBlocks clinicId={user.clinicId!} patientId={patient.id} />
    </div>
  );
}
