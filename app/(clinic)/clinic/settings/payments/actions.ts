"use server";

// Server actions of the prices-and-deposit settings. Each checks the manager role, parses the form
// with the shared schema and comes back to the page with a message (never a thrown error).
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { ZodError } from "zod";
import { requireUser } from "@/lib/auth/session";
import { saveDepositPolicy, savePriceList } from "@/lib/data/payments";
import { centsFromText, depositPolicySchema } from "@/lib/domain/payment-schemas";
import { AppError } from "@/lib/server/errors";
import { actionClient } from "@/lib/server/action";

const PAGE = "/clinic/settings/payments";

async function asManager(work: (actor: { user: Awaited<ReturnType<typeof requireUser>>; ip: string; userAgent: string }) => Promise<void>, done: string) {
  let target: string;
  try {
    const user = await requireUser(["admin"]);
    await work({ user, ...(await actionClient()) });
    revalidatePath(PAGE);
    target = `${PAGE}?saved=${encodeURIComponent(done)}`;
  } catch (err) {
    const message = err instanceof ZodError ? err.issues[0]?.message ?? "Check the form." : err instanceof AppError ? err.message : "Something went wrong on our side. Please try again.";
    if (!(err instanceof ZodError) && !(err instanceof AppError)) console.error("Payments settings action failed:", err instanceof Error ? err.name : err);
    target = `${PAGE}?error=${encodeURIComponent(message)}`;
  }
  redirect(target);
}

export async function savePricesAction(form: FormData) {
  await asManager(async (actor) => {
    const prices = [...form.entries()]
      .filter(([k]) => k.startsWith("fee:"))
      .map(([k, v]) => ({ materialId: k.slice(4), listFeeCents: String(v).trim() === "" ? null : centsFromText("the list price").parse(String(v)) }));
    await savePriceList(actor, prices);
  }, "Prices saved.");
}

export async function saveDepositPolicyAction(form: FormData) {
  await asManager(async (actor) => {
    const raw = Object.fromEntries([...form.entries()].filter(([, v]) => String(v).trim() !== ""));
    await saveDepositPolicy(actor, depositPolicySchema.parse(raw));
  }, "Deposit policy saved.");
}
