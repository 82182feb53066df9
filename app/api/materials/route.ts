import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { listMaterials } from "@/lib/data/materials";
import { route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** Active materials of the caller's clinic, with cautions, modes and indications. */
export const GET = route(async () => {
  const user = await requireUser();
  return NextResponse.json({ materials: await listMaterials({ clinicId: user.clinicId! }) });
});
