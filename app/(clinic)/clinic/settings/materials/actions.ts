"use server";

// Server action of the material-texts settings: checks the manager role itself, parses the input
// again (inside lib/data/materials.ts) and returns a typed state, never throws.
import { revalidatePath } from "next/cache";
import { headers } from "next/headers";
import { ZodError } from "zod";
import { requireUser } from "@/lib/auth/session";
import { saveMaterialTexts } from "@/lib/data/materials";
import { clientIpFrom } from "@/lib/server/client-ip";
import { AppError } from "@/lib/server/errors";
import type { ActionState } from "../actions";

const PATH = "/clinic/settings/materials";

export async function saveMaterialTextsAction(input: unknown): Promise<ActionState> {
  try {
    const user = await requireUser(["admin"]);
    const h = await headers();
    await saveMaterialTexts({ user, ip: clientIpFrom(h), userAgent: h.get("user-agent") ?? "unknown" }, input);
    revalidatePath(PATH);
    return { ok: true, message: "Texts saved. Patients see them from now on." };
  } catch (err) {
    if (err instanceof ZodError) {
      const fieldErrors: Record<string, string> = {};
      for (const issue of err.issues) fieldErrors[issue.path.join(".")] ??= issue.message;
      return { ok: false, message: err.issues[0]?.message ?? "Check the form.", fieldErrors };
    }
    if (err instanceof AppError) return { ok: false, message: err.message, ...(err.field ? { fieldErrors: { [err.field]: err.message } } : {}) };
    console.error("Material texts action failed:", err instanceof Error ? err.stack : err);
    return { ok: false, message: "Something went wrong on our side. Please try again." };
  }
}
