// Which language a request is served in, without URL prefixes or a middleware: a signed-in
// patient's saved preference, else the visitor's cookie, else the browser's Accept-Language.
// Staff pages stay in English for now.
import { getRequestConfig } from "next-intl/server";
import { cookies, headers } from "next/headers";
import { currentUser } from "@/lib/auth/session";
import { patientLanguage } from "@/lib/data/language";
import { DEFAULT_LOCALE, isLocale, LOCALE_COOKIE, localeFromAcceptLanguage, type Locale } from "@/lib/i18n/locale";
import { messagesFor } from "@/lib/i18n/messages";

async function requestLocale(): Promise<Locale> {
  const user = await currentUser();
  if (user?.role === "patient") return patientLanguage({ userId: user.id });
  if (user) return DEFAULT_LOCALE;
  const cookie = (await cookies()).get(LOCALE_COOKIE)?.value;
  if (isLocale(cookie)) return cookie;
  return localeFromAcceptLanguage((await headers()).get("accept-language")) ?? DEFAULT_LOCALE;
}

export default getRequestConfig(async () => {
  const locale = await requestLocale();
  return { locale, messages: messagesFor(locale) };
});
