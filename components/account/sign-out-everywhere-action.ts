"use server";

import { headers } from "next/headers";
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
