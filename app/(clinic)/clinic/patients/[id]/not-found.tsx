import Link from "next/link";

export default function PatientNotFound() {
  return (
    <div className="card space-y-2">
      <h1 className="text-2xl font-bold">Patient not found</h1>
      <p className="text-ink-soft">There is no patient with that link in your clinic.</p>
      <Link href="/clinic/patients">Back to all patients</Link>
    </div>
  );
}
