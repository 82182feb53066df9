"use server";

import { headers } from "next/headers";
import { requireUser } from "@/lib/auth/session";
import { publishTemplateVersion, type PublishResult } from "@/lib/data/consents";
import { fromDatabaseError } from "@/lib/server/db-errors";
import { AppError } from "@/lib/server/errors";
import { clientIpFrom } from "@/lib/server/client-ip";

/** Publishes the edited consent text as a new version (clinic manager only). */
export async function publishTemplate(values: unknown): Promise<PublishResult> {
  try {
    const user = await requireUser(["admin"]);
    const h = await headers();
    return await publishTemplateVersion({
      user,
      values,
      ip: clientIpFrom(h),
      userAgent: h.get("user-agent") ?? "unknown",
    });
  } catch (err) {
    const known = err instanceof AppError ? err : fromDatabaseError(err);
    if (known) return { ok: false, error: known.message, ...(known.field ? { field: known.field } : {}) };
    throw err;
  }
}
