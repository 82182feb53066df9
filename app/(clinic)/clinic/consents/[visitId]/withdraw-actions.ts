"use server";

// Staff record a withdrawal the patient made by phone, in person or in writing.
import { revalidatePath } from "next/cache";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { recordWithdrawalForPatient } from "@/lib/data/consent-withdrawal";
import { actionClient, actionFailure, type ActionState } from "@/lib/server/action";

export type WithdrawalState = ActionState;

export async function recordWithdrawalAction(input: unknown): Promise<WithdrawalState> {
  try {
    const user = await requireUser(STAFF_ROLES);
    const result = await recordWithdrawalForPatient({ user, input, ...(await actionClient()) });
    revalidatePath(`/clinic/consents/${result.appointmentId}`);
    return { ok: true, message: "The withdrawal is recorded. The visit needs a new signed consent before treatment." };
  } catch (err) {
    return actionFailure(err, "Recording a withdrawal");
  }
}
