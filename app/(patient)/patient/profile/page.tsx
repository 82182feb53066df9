import type { Metadata } from "next";
import type { CountryCode } from "libphonenumber-js";
import { getTranslations } from "next-intl/server";
import { requirePageUser } from "@/lib/auth/session";
import { getMe } from "@/lib/data/me";
import { displayPhone } from "@/lib/domain/patient-record";
import { MyDetailsForm } from "./my-details-form";

export async function generateMetadata(): Promise<Metadata> {
  return { title: (await getTranslations("myDetails"))("title") };
}

// The notices the e-mail confirmation link comes back with, as catalogue keys.
const NOTICES: Record<string, { ok: boolean; key: "noticeEmailChanged" | "noticeLinkExpired" | "noticeEmailTaken" }> = {
  "email-changed": { ok: true, key: "noticeEmailChanged" },
  "email-link-expired": { ok: false, key: "noticeLinkExpired" },
  "email-taken": { ok: false, key: "noticeEmailTaken" },
};

export default async function ProfilePage({ searchParams }: { searchParams: Promise<{ notice?: string }> }) {
  const user = await requirePageUser(["patient"]);
  const me = await getMe({ user });
  const t = await getTranslations("myDetails");
  const { notice } = await searchParams;
  const country = me.clinic.country as CountryCode;
  const shown = notice ? NOTICES[notice] : undefined;
  return (
    <div className="mx-auto max-w-read space-y-6">
      <h1 className="text-2xl font-bold">{t("title")}</h1>
      {shown ? <p role={shown.ok ? "status" : "alert"} className={`rounded-lg p-3 text-sm ${shown.ok ? "bg-harbour-50 text-harbour-700" : "bg-clay-50 text-clay-700"}`}>{t(shown.key)}</p> : null}
      <section className="card space-y-1 text-sm" aria-label={t("heldByClinic")}>
        <p><span className="text-ink-muted">{t("name")}</span> {me.name}</p>
        {me.dateOfBirth ? <p><span className="text-ink-muted">{t("dateOfBirth")}</span> {me.dateOfBirth}</p> : null}
        {me.address ? <p className="whitespace-pre-line"><span className="text-ink-muted">{t("address")}</span> {me.address}</p> : null}
        <p className="text-ink-soft">{t("askClinic", { clinic: me.clinic.name })}</p>
      </section>
      <section className="card" aria-label={t("canChange")}>
        <MyDetailsForm
          country={country}
          pendingEmail={me.pendingEmail}
          initial={{ phone: me.phone ? displayPhone(me.phone, country) : "", language: me.language, reminders: me.reminders, email: me.email }}
        />
      </section>
      <section className="card space-y-2" aria-labelledby="records-heading">
        <h2 id="records-heading" className="text-lg font-bold">{t("recordsHeading")}</h2>
        <p className="text-ink-soft">{t("recordsBody")}</p>
        <a href="/api/me/export" className="btn-primary" download>{t("downloadRecords")}</a>
      </section>
    </div>
  );
}
