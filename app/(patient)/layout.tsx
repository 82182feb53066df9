import { getTranslations } from "next-intl/server";
import { SiteHeader } from "@/components/site-header";
import { requirePageUser } from "@/lib/auth/session";

export const dynamic = "force-dynamic";

export default async function PatientLayout({ children }: { children: React.ReactNode }) {
  const user = await requirePageUser(["patient"]);
  const t = await getTranslations("nav");
  return (
    <>
      <SiteHeader user={user} nav={[{ href: "/patient", label: t("myCrown") }, { href: "/patient/documents", label: t("documents") }, { href: "/patient/profile", label: t("myDetails") }]} />
      <main id="main" className="mx-auto max-w-page px-gutter py-6">{children}</main>
    </>
  );
}
