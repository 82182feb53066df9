"use server";
// Saves where the clinic practises (clinic manager only; the data layer checks the role again).
import { revalidatePath } from "next/cache";
import { ZodError } from "zod";
import { requireUser } from "@/lib/auth/session";
import { setJurisdiction } from "@/lib/data/jurisdiction";
import { AppError } from "@/lib/server/errors";
import { actionClient } from "@/lib/server/action";

export type JurisdictionState = { ok: boolean; message: string };

export async function saveJurisdictionAction(input: unknown): Promise<JurisdictionState> {
  try {
    const user = await requireUser(["admin"]);
    await setJurisdiction({ user, input, ...(await actionClient()) });
    revalidatePath("/clinic/settings/jurisdiction");
    return { ok: true, message: "Saved. Consents signed from now on use this wording." };
  } catch (err) {
    if (err instanceof ZodError) return { ok: false, message: err.issues[0]?.message ?? "Choose where the clinic practises." };
    if (err instanceof AppError) return { ok: false, message: err.message };
    console.error("Saving the jurisdiction failed:", err instanceof Error ? err.message : err);
    return { ok: false, message: "Something went wrong on our side. Please try again." };
  }
}
