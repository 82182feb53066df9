"use server";
// Server action behind the reminder switch: signed-in patient, own visit only (404 otherwise).
import { headers } from "next/headers";
import { requireUser } from "@/lib/auth/session";
import { setVisitReminders } from "@/lib/data/mail";
import { AppError } from "@/lib/server/errors";
import { reminderToggleSchema, type ReminderToggleResult } from "./reminder-toggle-schema";
import { clientIpFrom } from "@/lib/server/client-ip";

export async function setRemindersAction(input: unknown): Promise<ReminderToggleResult> {
  const parsed = reminderToggleSchema.safeParse(input);
  if (!parsed.success) return { ok: false, error: parsed.error.issues[0]?.message ?? "That request is not valid." };
  try {
    const user = await requireUser(["patient"]);
    const h = await headers();
    const result = await setVisitReminders({
      user,
      appointmentId: parsed.data.appointmentId,
      enabled: parsed.data.enabled,
      ip: clientIpFrom(h),
      userAgent: h.get("user-agent"),
    });
    return { ok: true, enabled: result.remindersEnabled };
  } catch (err) {
    if (err instanceof AppError) return { ok: false, error: err.message };
    console.error("Changing reminders failed:", err instanceof Error ? err.message : err);
    return { ok: false, error: "Something went wrong on our side. Please try again." };
  }
}
