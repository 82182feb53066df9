import type { Metadata } from "next";
import type { CountryCode } from "libphonenumber-js";
import { requirePageUser } from "@/lib/auth/session";
import { getMe } from "@/lib/data/me";
import { displayPhone } from "@/lib/domain/patient-record";
import { MyDetailsForm } from "./my-details-form";

export const metadata: Metadata = { title: "My details" };

// Patient-facing sentences of this page, kept together for translation.
const NOTICES: Record<string, { ok: boolean; text: string }> = {
  "email-changed": { ok: true, text: "Your new e-mail address is confirmed. We write to it from now on." },
  "email-link-expired": { ok: false, text: "That confirmation link has expired or was already used. Enter the new address again to get a fresh link." },
  "email-taken": { ok: false, text: "That e-mail address is already used by another account, so your address was not changed." },
};

export default async function ProfilePage({ searchParams }: { searchParams: Promise<{ notice?: string }> }) {
  const user = await requirePageUser(["patient"]);
  const me = await getMe({ user });
  const { notice } = await searchParams;
  const country = me.clinic.country as CountryCode;
  const shown = notice ? NOTICES[notice] : undefined;
  return (
    <div className="mx-auto max-w-read space-y-6">
      <h1 className="text-2xl font-bold">My details</h1>
      {shown ? <p role={shown.ok ? "status" : "alert"} className={`rounded-lg p-3 text-sm ${shown.ok ? "bg-harbour-50 text-harbour-700" : "bg-clay-50 text-clay-700"}`}>{shown.text}</p> : null}
      <section className="card space-y-1 text-sm" aria-label="Held by your clinic">
        <p><span className="text-ink-muted">Name:</span> {me.name}</p>
        {me.dateOfBirth ? <p><span className="text-ink-muted">Date of birth:</span> {me.dateOfBirth}</p> : null}
        {me.address ? <p className="whitespace-pre-line"><span className="text-ink-muted">Address:</span> {me.address}</p> : null}
        <p className="text-ink-soft">To correct these, ask {me.clinic.name}.</p>
      </section>
      <section className="card" aria-label="What you can change">
        <MyDetailsForm
          country={country}
          pendingEmail={me.pendingEmail}
          initial={{ phone: me.phone ? displayPhone(me.phone, country) : "", language: me.language, reminders: me.reminders, email: me.email }}
        />
      </section>
      <section className="card space-y-2" aria-labelledby="records-heading">
        <h2 id="records-heading" className="text-lg font-bold">Your records</h2>
        <p className="text-ink-soft">
          You have the right to a copy of the personal information your clinic holds about you. The download is a ZIP file with your details,
          crown proposals, visits, consent records and e-mails as a JSON file, your signed consent PDFs and the documents in your account.
        </p>
        <a href="/api/me/export" className="btn-primary" download>Download my records</a>
      </section>
    </div>
  );
}
