// Signing out is a plain form: next-auth's sign-out endpoint takes a POST with the CSRF token and
// answers with a redirect, so no sign-out code runs in the browser.
import { getTranslations } from "next-intl/server";
import { csrfToken } from "@/lib/auth/csrf";
import { signOutEverywhereAndLeave } from "./account/sign-out-everywhere-action";

export async function SignOutButton() {
  const t = await getTranslations("common");
  const token = await csrfToken();
  return (
    <form method="post" action="/api/auth/signout">
      <input type="hidden" name="csrfToken" value={token} />
      <input type="hidden" name="callbackUrl" value="/" />
      <button type="submit" className="btn-quiet min-h-10 px-3 text-sm">{t("signOut")}</button>
    </form>
  );
}

/** In the header's account menu: ends the sessions on every device, then this one. */
export function SignOutEverywhereButton() {
  return (
    <form action={signOutEverywhereAndLeave}>
      <button type="submit" className="btn-quiet min-h-10 w-full px-3 text-left text-sm">Sign out on all devices</button>
    </form>
  );
}
