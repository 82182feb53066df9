import type { NextRequest } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { exportMyRecords } from "@/lib/data/patient-export";
import { clientInfo, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The signed-in patient's records as a ZIP (records.json, sealed consent PDFs, documents). */
export const GET = route(async (req: NextRequest) => {
  const user = await requireUser(["patient"]);
  const { zip, fileName } = await exportMyRecords({ user, info: clientInfo(req) });
  return new Response(Buffer.from(zip), {
    headers: {
      "Content-Type": "application/zip",
      "Content-Length": String(zip.byteLength),
      "Content-Disposition": `attachment; filename="${fileName}"`,
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
});
