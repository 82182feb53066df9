import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { VerifyForm } from "./verify-form";

export const metadata: Metadata = { title: "Check a consent PDF" };

export default async function VerifyConsentPage() {
  await requirePageUser(STAFF_ROLES);
  return (
    <div className="mx-auto max-w-read space-y-5">
      <p><Link href="/clinic/consents">← Consents today</Link></p>
      <h1 className="text-2xl font-bold">Check a consent PDF</h1>
      <p>
        Choose a consent PDF, for example one a patient or an insurer sends back. We compare its exact bytes with every sealed
        consent this clinic has issued. Any change, even a single character, means it does not match.
      </p>
      <VerifyForm />
    </div>
  );
}
