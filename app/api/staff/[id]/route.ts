import { NextResponse, type NextRequest } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { staffAccessSchema } from "@/lib/domain/settings-schemas";
import { changeStaffAccess } from "@/lib/data/staff";
import { clientInfo, idParams, readJson, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The clinic manager turns a staff account on or off or changes its role; its sessions end. */
export const PATCH = route(async (req: NextRequest, { params }: { params: Promise<{ id: string }> }) => {
  const user = await requireUser(["admin"]);
  const { id } = await idParams(params, "id");
  const body = await readJson(req, staffAccessSchema);
  const result = await changeStaffAccess({ user, ...clientInfo(req) }, id, body);
  return NextResponse.json(result);
});
