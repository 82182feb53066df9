"use server";

// Server actions of the visit-plan settings. Each checks the admin role itself, parses the input
// again (inside lib/data/plan-settings.ts) and returns a typed state, never throws.
import { revalidatePath } from "next/cache";
import { requireUser } from "@/lib/auth/session";
import * as plan from "@/lib/data/plan-settings";
import type { ActionState } from "../actions";
import { actionClient, actionFailure } from "@/lib/server/action";

const PATH = "/clinic/settings/plan";

async function run(work: (actor: plan.Actor) => Promise<unknown>, done: string): Promise<ActionState> {
  try {
    const user = await requireUser(["admin"]);
    await work({ user, ...(await actionClient()) });
    revalidatePath(PATH);
    return { ok: true, message: done };
  } catch (err) {
    return actionFailure(err, "Plan settings action");
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
