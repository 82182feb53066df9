import Link from "next/link";
import { requirePageUser } from "@/lib/auth/session";

const SECTIONS = [
  { href: "/clinic/settings/hours", label: "Opening hours" },
  { href: "/clinic/settings/equipment", label: "Equipment" },
  { href: "/clinic/settings/durations", label: "Stage durations" },
  { href: "/clinic/settings/plan", label: "Visit plan" },
  { href: "/clinic/settings/stage-times", label: "Estimated vs actual" },
  { href: "/clinic/settings/booking", label: "Booking and reminders" },
  { href: "/clinic/settings/payments", label: "Prices and deposit" },
  { href: "/clinic/settings/materials", label: "Material texts" },
  { href: "/clinic/settings/staff", label: "Staff" },
  { href: "/clinic/settings/jurisdiction", label: "Jurisdiction" },
];

/** Settings are for the clinic manager only; every action checks the role again. */
export default async function SettingsLayout({ children }: { children: React.ReactNode }) {
  await requirePageUser(["admin"]);
  return (
    <div className="space-y-4">
      <nav aria-label="Settings sections" className="overflow-x-auto">
        <ul className="flex flex-wrap gap-2">
          {SECTIONS.map((s) => (
            <li key={s.href}>
              <Link href={s.href} className="inline-flex min-h-10 items-center rounded-full border border-line bg-white px-3 text-sm font-semibold text-ink-soft no-underline hover:bg-paper-deep hover:no-underline">{s.label}</Link>
            </li>
          ))}
        </ul>
      </nav>
      {children}
    </div>
  );
}
