"use server";
// Server action behind the language switcher: a cookie for everyone, and the signed-in
// patient's saved preference (so e-mails and the consent follow it too).
import { cookies } from "next/headers";
import { z } from "zod";
import { currentUser } from "@/lib/auth/session";
import { setPatientLanguage } from "@/lib/data/language";
import { LOCALE_COOKIE, LOCALES } from "@/lib/i18n/locale";
import { actionClient } from "@/lib/server/action";

const languageSchema = z.object({ language: z.enum(LOCALES) });
export type LanguageResult = { ok: true } | { ok: false; error: string };

export async function setLanguageAction(input: unknown): Promise<LanguageResult> {
  const parsed = languageSchema.safeParse(input);
  if (!parsed.success) return { ok: false, error: "Choose English or French." };
  const { language } = parsed.data;
  try {
    const user = await currentUser();
    if (user?.role === "patient") {
      await setPatientLanguage({ user, language, ...(await actionClient()) });
    }
    (await cookies()).set(LOCALE_COOKIE, language, { path: "/", sameSite: "lax", maxAge: 60 * 60 * 24 * 365, httpOnly: true });
    return { ok: true };
  } catch (err) {
    console.error("Changing the language failed:", err instanceof Error ? err.message : err);
    return { ok: false, error: "The language could not be saved." };
  }
}
