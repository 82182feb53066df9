"use client";

import { signOut } from "next-auth/react";
import { useTranslations } from "next-intl";
import { signOutEverywhereAction } from "./account/sign-out-everywhere-action";

export function SignOutButton() {
  const t = useTranslations("common");
  return (
    <button type="button" className="btn-quiet min-h-10 px-3 text-sm" onClick={() => signOut({ callbackUrl: "/" })}>
      {t("signOut")}
    </button>
  );
}

/** In the header's account menu: ends the sessions on every device, then this one. */
export function SignOutEverywhereButton() {
  return (
    <button
      type="button"
      className="btn-quiet min-h-10 w-full px-3 text-left text-sm"
      onClick={async () => {
        await signOutEverywhereAction();
        await signOut({ callbackUrl: "/sign-in" });
      }}
    >
      Sign out on all devices
    </button>
  );
}
