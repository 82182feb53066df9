"use server";

// Staff record a withdrawal the patient made by phone, in person or in writing.
import { revalidatePath } from "next/cache";
import { headers } from "next/headers";
import { ZodError } from "zod";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { recordWithdrawalForPatient } from "@/lib/data/consent-withdrawal";
import { AppError } from "@/lib/server/errors";

export type WithdrawalState = { ok: true; message: string } | { ok: false; message: string; fieldErrors?: Record<string, string> };

export async function recordWithdrawalAction(input: unknown): Promise<WithdrawalState> {
  try {
    const user = await requireUser(STAFF_ROLES);
    const h = await headers();
    const result = await recordWithdrawalForPatient({
      user, input, ip: h.get("x-forwarded-for")?.split(",")[0]?.trim() || h.get("x-real-ip") || "unknown", userAgent: h.get("user-agent") ?? "unknown",
    });
    revalidatePath(`/clinic/consents/${result.appointmentId}`);
    return { ok: true, message: "The withdrawal is recorded. The visit needs a new signed consent before treatment." };
  } catch (err) {
    if (err instanceof ZodError) {
      const fieldErrors: Record<string, string> = {};
      for (const issue of err.issues) fieldErrors[issue.path.join(".")] ??= issue.message;
      return { ok: false, message: err.issues[0]?.message ?? "Check the form.", fieldErrors };
    }
    if (err instanceof AppError) return { ok: false, message: err.message, ...(err.field ? { fieldErrors: { [err.field]: err.message } } : {}) };
    console.error("Recording a withdrawal failed:", err instanceof Error ? err.stack : err);
    return { ok: false, message: "Something went wrong on our side. Please try again." };
  }
}
