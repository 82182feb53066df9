import { NextResponse, type NextRequest } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { loadBoard } from "@/lib/data/board";
import { route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The day board for `?day=YYYY-MM-DD` (clinic-local; today when left out), staff only. */
export const GET = route(async (req: NextRequest) => {
  const user = await requireUser(STAFF_ROLES);
  const board = await loadBoard({ clinicId: user.clinicId!, day: req.nextUrl.searchParams.get("day") });
  return NextResponse.json(board, { headers: { "Cache-Control": "no-store" } });
});
