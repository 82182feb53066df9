"use server";

// Server actions of the settings forms. Each one checks the admin role itself, parses the input
// again with the form's schema (inside lib/data/settings.ts) and returns a typed state, never throws.
import { revalidatePath } from "next/cache";
import { requireUser } from "@/lib/auth/session";
import * as settings from "@/lib/data/settings";
import { endStaffSessions } from "@/lib/data/staff";
import { fromDatabaseError } from "@/lib/server/db-errors";
import { badRequest } from "@/lib/server/errors";
import { actionClient, actionFailure, type ActionState } from "@/lib/server/action";

export type { ActionState };

async function asAdmin<T>(work: (actor: settings.Actor) => Promise<T>, done: string, path: string): Promise<ActionState> {
  try {
    const user = await requireUser(["admin"]);
    await work({ user, ...(await actionClient()) });
    revalidatePath(path);
    return { ok: true, message: done };
  } catch (err) {
    return actionFailure(fromDatabaseError(err) ?? err, "Settings action");
  }
}

export async function saveOpeningHoursAction(input: unknown) {
  return asAdmin((a) => settings.saveOpeningHours(a, input), "Opening hours saved.", "/clinic/settings/hours");
}
export async function addClosedDayAction(input: unknown) {
  return asAdmin((a) => settings.addClosedDay(a, input), "Closed day added.", "/clinic/settings/hours");
}
export async function removeClosedDayAction(id: number) {
  return asAdmin(
    (a) => {
      // A server action's argument is whatever the browser posted: only a positive whole number is an id.
      const n = Number(id);
      if (!Number.isSafeInteger(n) || n < 1) throw badRequest("That closed day is not valid.", "id");
      return settings.removeClosedDay(a, n);
    },
    "Closed day removed.",
    "/clinic/settings/hours",
  );
}
export async function saveEquipmentAction(input: unknown) {
  return asAdmin((a) => settings.saveEquipment(a, input), "Equipment saved.", "/clinic/settings/equipment");
}
export async function saveStageDurationsAction(input: unknown) {
  return asAdmin((a) => settings.saveStageDurations(a, input), "Stage durations saved. New bookings use them; booked visits keep their plan.", "/clinic/settings/durations");
}
export async function saveMaterialModesAction(input: unknown) {
  return asAdmin((a) => settings.saveMaterialModes(a, input), "Material minutes saved. New bookings use them; booked visits keep their plan.", "/clinic/settings/durations");
}
export async function saveBookingSettingsAction(input: unknown) {
  return asAdmin((a) => settings.saveBookingSettings(a, input), "Booking and reminder settings saved.", "/clinic/settings/booking");
}
export async function createStaffAction(input: unknown) {
  return asAdmin((a) => settings.createStaffAccount(a, input), "Staff account created. Give them the password in person.", "/clinic/settings/staff");
}
export async function saveTwoFactorRequirementAction(input: unknown) {
  return asAdmin((a) => settings.saveTwoFactorRequirement(a, input), "Sign-in rule saved.", "/clinic/settings/staff");
}
export async function endStaffSessionsAction(staffId: string) {
  return asAdmin((a) => endStaffSessions(a, String(staffId)), "Their open sessions have ended; they must sign in again.", "/clinic/settings/staff");
}
export async function updateStaffAction(input: unknown) {
  return asAdmin((a) => settings.updateStaffAccount(a, input), "Staff account updated.", "/clinic/settings/staff");
}
