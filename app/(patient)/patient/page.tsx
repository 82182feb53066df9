import type { Metadata } from "next";
import Link from "next/link";
import { getTranslations } from "next-intl/server";
import { CautionsNote } from "@/components/cautions-note";
import { StatusBadge } from "@/components/visits/status-badge";
import { requirePageUser } from "@/lib/auth/session";
import { patientOf } from "@/lib/data/access";
import { clinicOf } from "@/lib/data/clinics";
import { listProposals } from "@/lib/data/proposals";
import { listPatientVisits } from "@/lib/data/visits";
import { toothWords } from "@/lib/i18n/tooth-words";
import { materialName } from "@/lib/i18n/material-texts";
import { money, when } from "@/lib/format";
import { currentLocale } from "@/lib/i18n/server";

export async function generateMetadata(): Promise<Metadata> {
  return { title: (await getTranslations("nav"))("myCrown") };
}

export default async function PatientHomePage() {
  const user = await requirePageUser(["patient"]);
  const patient = await patientOf(user);
  const [proposals, visits, clinic] = await Promise.all([listProposals({ user }), listPatientVisits({ patientId: patient.id }), clinicOf(user)]);
  const open = proposals.filter((p) => p.status === "open" && !p.activeVisit);
  const zone = clinic!.timeZone;
  const t = await getTranslations("home");
  const tc = await getTranslations("common");
  const locale = await currentLocale();
  const firstName = user.name?.split(" ")[0];
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">{firstName ? t("hello", { name: firstName }) : t("helloAnonymous")}</h1>

      <section aria-labelledby="to-book" className="space-y-3">
        <h2 id="to-book" className="text-lg font-semibold">{t("toBook")}</h2>
        {open.length === 0 ? (
          <p className="card text-ink-soft">{t("nothingToBook")}</p>
        ) : (
          <ul className="grid gap-3 sm:grid-cols-2">
            {open.map((p) => (
              <li key={p.id} className="card">
                <p className="text-sm font-semibold text-harbour-700">{tc("toothLine", { fdi: p.tooth.fdi, universal: p.tooth.universal })}</p>
                <h3 className="text-lg font-semibold first-letter:uppercase">{toothWords(p.tooth.fdi, locale)}</h3>
                {p.note ? <p className="mt-1 text-ink-soft" data-free-text>{p.note}</p> : null}
                <p className="mt-2 text-sm">{t("materialsAndFee", { count: p.materials.length, fee: money(p.feeCents, clinic!.currency, locale) })}</p>
                <Link href={`/patient/proposals/${p.id}`} className="btn-primary mt-3 w-full sm:w-auto">{t("compareAndBook")}</Link>
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="visits" className="space-y-3">
        <h2 id="visits" className="text-lg font-semibold">{t("myVisits")}</h2>
        {visits.length === 0 ? (
          <p className="card text-ink-soft">{t("noVisits")}</p>
        ) : (
          <ul className="space-y-3">
            {visits.map((v) => (
              <li key={v.id} className="card flex flex-wrap items-center justify-between gap-3">
                <div>
                  <p className="font-semibold first-letter:uppercase">{toothWords(v.tooth, locale)} · {v.material ? materialName(v.material, locale) : null}</p>
                  <p className="text-sm text-ink-soft">{when(v.startsAt, zone, locale)}</p>
                  <div className="mt-1"><StatusBadge status={v.status} /></div>
                </div>
                <Link href={`/patient/visits/${v.id}`} className="btn-quiet">{t("openVisit")}</Link>
              </li>
            ))}
          </ul>
        )}
      </section>
      <CautionsNote />
    </div>
  );
}
