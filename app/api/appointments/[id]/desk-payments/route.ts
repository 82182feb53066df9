import { NextResponse } from "next/server";
import { z } from "zod";
import { requireUser } from "@/lib/auth/session";
import { recordDeskPayment } from "@/lib/data/payments";
import { clientInfo, idParams, readJson, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** Reception records money taken at the desk `{ method, amount, reference? }` (audited). */
export const POST = route<{ params: Promise<{ id: string }> }>(async (req, { params }) => {
  const user = await requireUser(["reception", "admin"]);
  const { id } = await idParams(params, "id");
  const body = await readJson(req, z.unknown());
  return NextResponse.json(await recordDeskPayment({ user, ...clientInfo(req) }, id, body), { status: 201 });
});
