import { NextResponse, type NextRequest } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { loadBoard } from "@/lib/data/board";
import { z } from "zod";
import { calendarDateSchema } from "@/lib/domain/input";
import { parseQuery, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

const query = z.object({ day: calendarDateSchema("day").optional() });

/** The day board for `?day=YYYY-MM-DD` (clinic-local; today when left out), staff only. */
export const GET = route(async (req: NextRequest) => {
  const user = await requireUser(STAFF_ROLES);
  const { day } = parseQuery(req, query);
  return NextResponse.json(await loadBoard({ clinicId: user.clinicId!, day }));
});
