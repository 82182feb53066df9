// Plumbing shared by server actions: who is asking from where (the same client-IP rule as route
// handlers, never the left-most X-Forwarded-For hop), and one typed failure state.
import "server-only";
import { headers } from "next/headers";
import { ZodError } from "zod";
import { clientIpFrom } from "./client-ip";
import { AppError } from "./errors";

export type ActionState = { ok: true; message: string } | { ok: false; message: string; fieldErrors?: Record<string, string> };

/** The request's client address and user agent, for audit events written by an action. */
export async function actionClient(): Promise<{ ip: string; userAgent: string }> {
  const h = await headers();
  return { ip: clientIpFrom(h), userAgent: h.get("user-agent") ?? "unknown" };
}

/** A refused input or rule as a message (with field errors); anything else is logged as `what` failed. */
export function actionFailure(err: unknown, what: string): Extract<ActionState, { ok: false }> {
  if (err instanceof ZodError) {
    const fieldErrors: Record<string, string> = {};
    for (const issue of err.issues) fieldErrors[issue.path.join(".")] ??= issue.message;
    return { ok: false, message: err.issues[0]?.message ?? "Check the form.", fieldErrors };
  }
  if (err instanceof AppError) return { ok: false, message: err.message, ...(err.field ? { fieldErrors: { [err.field]: err.message } } : {}) };
  console.error(`${what} failed:`, err instanceof Error ? err.stack : err);
  return { ok: false, message: "Something went wrong on our side. Please try again." };
}
