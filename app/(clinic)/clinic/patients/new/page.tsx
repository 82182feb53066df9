import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { patientSchemaContext } from "@/lib/data/patients";
import { RegisterPatientForm } from "./register-patient-form";

export const metadata: Metadata = { title: "Register a patient" };

export default async function NewPatientPage() {
  const user = await requirePageUser(STAFF_ROLES);
  const { country, today } = await patientSchemaContext({ clinicId: user.clinicId! });
  return (
    <div className="mx-auto max-w-read space-y-4">
      <Link href="/clinic/patients" className="text-sm">← All patients</Link>
      <h1 className="text-2xl font-bold">Register a patient</h1>
      <p className="text-ink-soft">After registering, send the patient an invitation from their page: it e-mails them a link that signs them in.</p>
      <RegisterPatientForm country={country} today={today} />
    </div>
  );
}
