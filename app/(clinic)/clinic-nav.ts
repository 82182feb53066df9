import type { Role } from "@/lib/domain/types";
import type { NavItem } from "@/components/site-header";

/** The clinic sections each staff role sees in the header. */
export function clinicNav(role: Role): NavItem[] {
  const items: (NavItem & { roles: Role[] })[] = [
    { href: "/clinic", label: "Today", roles: ["reception", "dentist", "admin"] },
    { href: "/clinic/requests", label: "Requests", roles: ["reception", "admin"] },
    { href: "/clinic/patients", label: "Patients", roles: ["reception", "dentist", "admin"] },
    { href: "/clinic/board", label: "Day board", roles: ["reception", "dentist"] },
    { href: "/clinic/consents", label: "Consents", roles: ["reception", "dentist", "admin"] },
    { href: "/clinic/lots", label: "Lots", roles: ["reception", "dentist", "admin"] },
    { href: "/clinic/payments", label: "Payments", roles: ["reception", "admin"] },
    { href: "/clinic/settings", label: "Settings", roles: ["admin"] },
    { href: "/clinic/consent-templates", label: "Consent texts", roles: ["admin"] },
  ];
  return items.filter((i) => i.roles.includes(role)).map(({ href, label }) => ({ href, label }));
}
