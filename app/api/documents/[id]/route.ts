import type { NextRequest } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { openDocument } from "@/lib/data/documents";
import { clientInfo, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The document's bytes, for its patient and the staff of its clinic; `?download=1` saves instead of showing. */
export const GET = route<{ params: Promise<{ id: string }> }>(async (req: NextRequest, { params }) => {
  const user = await requireUser();
  const { id } = await params;
  const download = req.nextUrl.searchParams.get("download") === "1";
  const doc = await openDocument({ actor: user, documentId: id, download, client: clientInfo(req) });
  const ascii = doc.fileName.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return new Response(doc.body, {
    headers: {
      "Content-Type": doc.contentType,
      "Content-Length": String(doc.length),
      "Content-Disposition": `${download ? "attachment" : "inline"}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(doc.fileName)}`,
      // Personal health data: never kept by shared caches or the browser's back-forward cache.
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
});
