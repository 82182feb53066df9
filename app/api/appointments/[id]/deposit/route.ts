import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { startCheckout } from "@/lib/payments/deposits";
import { clientInfo, idParams, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** Opens the hosted payment page for the visit's deposit; the amount is the server's own. */
export const POST = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["patient", "reception", "admin"]);
  const { id } = await idParams(params, "id");
  return NextResponse.json(await startCheckout({ user, ...clientInfo(req) }, id));
});
