"use client";

import { signOut } from "next-auth/react";
import { useTranslations } from "next-intl";

export function SignOutButton() {
  const t = useTranslations("common");
  return (
    <button type="button" className="btn-quiet min-h-10 px-3 text-sm" onClick={() => signOut({ callbackUrl: "/" })}>
      {t("signOut")}
    </button>
  );
}
