"use server";

import { headers } from "next/headers";
import { confirmEnrolment } from "@/lib/auth/account";
import { enrolSchema } from "@/lib/auth/schemas";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { clientIpFrom } from "@/lib/server/client-ip";

export type EnrolState = { ok: true; recoveryCodes: string[] } | { ok: false; message: string };

/** Finishes two-factor enrolment with the first code from the app; returns the recovery codes once. */
export async function confirmEnrolmentAction(input: unknown): Promise<EnrolState> {
  const user = await requireUser(STAFF_ROLES, { allowSetup: true }).catch(() => null);
  if (!user) return { ok: false, message: "Please sign in again." };
  const parsed = enrolSchema.safeParse(input);
  if (!parsed.success) return { ok: false, message: parsed.error.issues[0]?.message ?? "Enter the 6-digit code your app shows." };
  const h = await headers();
  const codes = await confirmEnrolment(user, parsed.data.code, { ip: clientIpFrom(h), userAgent: h.get("user-agent") ?? undefined });
  if (!codes) return { ok: false, message: "That code did not match. Check the app shows Cuspal and enter the code it shows now." };
  return { ok: true, recoveryCodes: codes };
}
