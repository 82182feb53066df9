"use server";

import { cookies, headers } from "next/headers";
import { redirect } from "next/navigation";
import { signOutEverywhere } from "@/lib/auth/account";
import { requireUser } from "@/lib/auth/session";
import { clientIpFrom } from "@/lib/server/client-ip";

/** Ends every session of the signed-in person, on every device (this one too). */
export async function signOutEverywhereAction(): Promise<{ ok: boolean }> {
  const user = await requireUser(undefined, { allowSetup: true }).catch(() => null);
  if (!user) return { ok: false };
  const h = await headers();
  await signOutEverywhere(user, { ip: clientIpFrom(h), userAgent: h.get("user-agent") ?? undefined });
  return { ok: true };
}

// next-auth's session cookie, plain or __Secure-, whole or in chunks (.0, .1, …).
const SESSION_COOKIE = /^(__Secure-)?next-auth\.session-token(\.\d+)?$/;

/** The account menu's form: every session ends, this browser forgets its cookie, then the sign-in page. */
export async function signOutEverywhereAndLeave(): Promise<void> {
  await signOutEverywhereAction();
  const jar = await cookies();
  for (const c of jar.getAll()) {
    // A __Secure- cookie can only be replaced by a Secure one.
    if (SESSION_COOKIE.test(c.name)) jar.set(c.name, "", { maxAge: 0, path: "/", httpOnly: true, sameSite: "lax", secure: c.name.startsWith("__Secure-") });
  }
  redirect("/sign-in");
}
