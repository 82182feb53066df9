import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { markStage, stageMarkSchema } from "@/lib/data/progress";
import { clientInfo, idParams, readJson, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** Marks a stage started or finished: `{ action: "start" | "finish", at? }` (dentist, reception). */
export const POST = route<{ params: Promise<{ id: string; key: string }> }>(async (req, { params }) => {
  const user = await requireUser(["dentist", "reception"]);
  const { id, key } = await idParams(params, "id");
  const mark = await readJson(req, stageMarkSchema);
  return NextResponse.json(await markStage({ user, appointmentId: id, key, mark, ...clientInfo(req) }));
});
