"use server";

// Server actions of the visit-plan settings. Each checks the admin role itself, parses the input
// again (inside lib/data/plan-settings.ts) and returns a typed state, never throws.
import { revalidatePath } from "next/cache";
import { headers } from "next/headers";
import { ZodError } from "zod";
import { requireUser } from "@/lib/auth/session";
import * as plan from "@/lib/data/plan-settings";
import { AppError } from "@/lib/server/errors";
import type { ActionState } from "../actions";

const PATH = "/clinic/settings/plan";

async function run(work: (actor: plan.Actor) => Promise<unknown>, done: string): Promise<ActionState> {
  try {
    const user = await requireUser(["admin"]);
    const h = await headers();
    const actor = { user, ip: h.get("x-forwarded-for")?.split(",")[0]?.trim() || h.get("x-real-ip") || "unknown", userAgent: h.get("user-agent") ?? "unknown" };
    await work(actor);
    revalidatePath(PATH);
    return { ok: true, message: done };
  } catch (err) {
    if (err instanceof ZodError) {
      const fieldErrors: Record<string, string> = {};
      for (const issue of err.issues) fieldErrors[issue.path.join(".")] ??= issue.message;
      return { ok: false, message: err.issues[0]?.message ?? "Check the form.", fieldErrors };
    }
    if (err instanceof AppError) return { ok: false, message: err.message, ...(err.field ? { fieldErrors: { [err.field]: err.message } } : {}) };
    console.error("Plan settings action failed:", err instanceof Error ? err.stack : err);
    return { ok: false, message: "Something went wrong on our side. Please try again." };
  }
}

export async function saveStageOrderAction(input: unknown) {
  return run((a) => plan.saveStageOrder(a, input), "Stage order saved. New bookings use it; booked visits keep their plan.");
}
export async function saveFurnaceProgrammeAction(input: unknown) {
  return run((a) => plan.saveFurnaceProgramme(a, input), "Furnace programme saved.");
}
export async function deleteFurnaceProgrammeAction(id: string) {
  return run((a) => plan.deleteFurnaceProgramme(a, String(id)), "Furnace programme removed.");
}
export async function saveFiringAssignmentsAction(input: unknown) {
  return run((a) => plan.saveFiringAssignments(a, input), "Firings saved. New bookings use them; booked visits keep their plan.");
}
