import { ClientMessages } from "@/components/i18n/client-messages";
import { SiteHeader } from "@/components/site-header";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { clinicNav } from "./clinic-nav";

export const dynamic = "force-dynamic";

export default async function ClinicLayout({ children }: { children: React.ReactNode }) {
  const user = await requirePageUser(STAFF_ROLES);
  return (
    <>
      <SiteHeader user={user} nav={clinicNav(user.role)} />
      <main id="main" className="mx-auto max-w-page px-gutter py-6"><ClientMessages>{children}</ClientMessages></main>
    </>
  );
}
