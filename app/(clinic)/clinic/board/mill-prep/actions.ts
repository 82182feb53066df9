"use server";

// Block marks from the mill preparation list: plain form posts, so they work without scripts.
import { revalidatePath } from "next/cache";
import { ZodError } from "zod";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { markBlockLoaded, recordVisitBlock } from "@/lib/data/mill-prep";
import { AppError } from "@/lib/server/errors";
import { actionClient } from "@/lib/server/action";

export type BlockState = { ok: boolean; message: string } | null;

function failure(err: unknown): BlockState {
  if (err instanceof ZodError) return { ok: false, message: err.issues[0]?.message ?? "Check the form." };
  if (err instanceof AppError) return { ok: false, message: err.message };
  console.error("Block mark failed:", err instanceof Error ? err.stack : err);
  return { ok: false, message: "Something went wrong on our side. Please try again." };
}

export async function markBlockLoadedAction(_prev: BlockState, form: FormData): Promise<BlockState> {
  try {
    const user = await requireUser(STAFF_ROLES);
    await markBlockLoaded({ user, input: { appointmentId: form.get("appointmentId"), loaded: form.get("loaded") }, ...(await actionClient()) });
    revalidatePath("/clinic/board/mill-prep");
    return { ok: true, message: form.get("loaded") === "yes" ? "Marked as loaded." : "Mark taken back." };
  } catch (err) {
    return failure(err);
  }
}

export async function recordVisitBlockAction(_prev: BlockState, form: FormData): Promise<BlockState> {
  try {
    const user = await requireUser(["dentist", "admin"]);
    await recordVisitBlock({ user, input: { appointmentId: form.get("appointmentId"), shade: form.get("shade"), blockSize: form.get("blockSize") }, ...(await actionClient()) });
    revalidatePath("/clinic/board/mill-prep");
    return { ok: true, message: "Shade and block size saved." };
  } catch (err) {
    return failure(err);
  }
}
