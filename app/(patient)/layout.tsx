import { SiteHeader } from "@/components/site-header";
import { requirePageUser } from "@/lib/auth/session";

export const dynamic = "force-dynamic";

export default async function PatientLayout({ children }: { children: React.ReactNode }) {
  const user = await requirePageUser(["patient"]);
  return (
    <>
      <SiteHeader user={user} nav={[{ href: "/patient", label: "My crown" }, { href: "/patient/documents", label: "Documents" }, { href: "/patient/profile", label: "My details" }]} />
      <main id="main" className="mx-auto max-w-page px-gutter py-6">{children}</main>
    </>
  );
}
