"use server";

// Server action of the material-texts settings: checks the manager role itself, parses the input
// again (inside lib/data/materials.ts) and returns a typed state, never throws.
import { revalidatePath } from "next/cache";
import { requireUser } from "@/lib/auth/session";
import { saveMaterialTexts } from "@/lib/data/materials";
import type { ActionState } from "../actions";
import { actionClient, actionFailure } from "@/lib/server/action";

const PATH = "/clinic/settings/materials";

export async function saveMaterialTextsAction(input: unknown): Promise<ActionState> {
  try {
    const user = await requireUser(["admin"]);
    await saveMaterialTexts({ user, ...(await actionClient()) }, input);
    revalidatePath(PATH);
    return { ok: true, message: "Texts saved. Patients see them from now on." };
  } catch (err) {
    return actionFailure(err, "Material texts action");
  }
}
