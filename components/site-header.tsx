import Link from "next/link";
import { getTranslations } from "next-intl/server";
import type { SessionUser } from "@/lib/auth/session";
import { Brand } from "./brand";
import { LanguageSwitcher } from "./i18n/language-switcher";
import { SignOutButton, SignOutEverywhereButton } from "./sign-out-button";

const ROLE_LABEL = { patient: "Patient", reception: "Reception", dentist: "Dentist", admin: "Clinic manager" } as const;

export type NavItem = { href: string; label: string };

export async function SiteHeader({ user, nav = [] }: { user: SessionUser; nav?: NavItem[] }) {
  const t = await getTranslations("common");
  return (
    <header className="border-b border-line bg-white">
      <div className="mx-auto flex max-w-page flex-wrap items-center justify-between gap-3 px-gutter py-3">
        <Brand href={user.role === "patient" ? "/patient" : "/clinic"} />
        {/* Wraps on a phone: the name, the language switcher and two buttons do not fit 390 px in one row. */}
        <div className="flex flex-wrap items-center justify-end gap-3">
          <p className="text-right text-sm leading-tight">
            <span className="block font-semibold" data-testid="signed-in-name">{user.name ?? user.email}</span>
            <span className="text-ink-muted">{user.role === "patient" ? t("patientRole") : ROLE_LABEL[user.role]}</span>
          </p>
          {user.role === "patient" ? <LanguageSwitcher /> : null}
          <SignOutButton />
          <details className="relative">
            <summary className="btn-quiet min-h-10 cursor-pointer list-none px-3 text-sm">{t("account")}</summary>
            <div className="absolute right-0 z-10 mt-1 w-56 rounded-lg border border-line bg-white p-2 shadow-md">
              {user.role !== "patient" ? (
                <Link href="/two-factor" className="block min-h-10 rounded-md px-3 py-2 text-sm no-underline hover:bg-paper-deep">Two-factor sign-in</Link>
              ) : null}
              <SignOutEverywhereButton />
            </div>
          </details>
        </div>
      </div>
      {nav.length > 0 ? (
        <nav aria-label={t("sections")} className="mx-auto max-w-page overflow-x-auto px-gutter">
          <ul className="flex gap-1 pb-2">
            {nav.map((item) => (
              <li key={item.href}>
                <Link href={item.href} className="inline-block min-h-10 whitespace-nowrap rounded-md px-3 py-2 text-sm font-semibold text-ink-soft no-underline hover:bg-paper-deep hover:no-underline">
                  {item.label}
                </Link>
              </li>
            ))}
          </ul>
        </nav>
      ) : null}
    </header>
  );
}
