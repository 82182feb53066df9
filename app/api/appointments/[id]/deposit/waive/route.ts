import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { waiveSchema } from "@/lib/domain/payment-schemas";
import { waiveDeposit } from "@/lib/payments/deposits";
import { clientInfo, idParams, readJson, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** Reception waives a due deposit, with a reason (audited). */
export const POST = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["reception", "admin"]);
  const { id } = await idParams(params, "id");
  const { reason } = await readJson(req, waiveSchema);
  const deposit = await waiveDeposit({ user, ...clientInfo(req) }, id, reason);
  return NextResponse.json({ amountCents: deposit.amountCents, currency: deposit.currency, status: deposit.status });
});
