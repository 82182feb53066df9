import { NextResponse } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { createOutage, listOutages } from "@/lib/data/outages";
import { clientInfo, readJson, route } from "@/lib/server/api";
import { z } from "zod";

export const dynamic = "force-dynamic";

/** Current and coming out-of-service ranges, with the booked visits each one touches (staff). */
export const GET = route(async () => {
  const user = await requireUser(STAFF_ROLES);
  return NextResponse.json({ outages: await listOutages({ clinicId: user.clinicId! }) });
});

/** Marks a chair, mill or furnace out of service: `{ equipmentId, start, end, reason? }` in clinic time. */
export const POST = route(async (req) => {
  const user = await requireUser(STAFF_ROLES);
  const body = await readJson(req, z.unknown());
  // createOutage parses it with the form's schema.
  return NextResponse.json(await createOutage({ user, input: body, ...clientInfo(req) }), { status: 201 });
});
