import { NextResponse } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { listStaff } from "@/lib/data/staff";
import { route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The clinic's staff accounts (staff only). */
export const GET = route(async () => {
  const user = await requireUser(STAFF_ROLES);
  return NextResponse.json({ staff: await listStaff({ clinicId: user.clinicId! }) });
});
