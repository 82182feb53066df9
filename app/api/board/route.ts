import { NextResponse, type NextRequest } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { loadBoard } from "@/lib/data/board";
import { parseQuery, route } from "@/lib/server/api";
import { boardQuery } from "@/lib/server/route-schemas";

export const dynamic = "force-dynamic";

/** The day board for `?day=YYYY-MM-DD` (clinic-local; today when left out), staff only. */
export const GET = route(async (req: NextRequest) => {
  const user = await requireUser(STAFF_ROLES);
  const { day } = parseQuery(req, boardQuery);
  return NextResponse.json(await loadBoard({ clinicId: user.clinicId!, day }));
});
