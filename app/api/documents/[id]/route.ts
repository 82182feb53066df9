import type { NextRequest } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { openDocument } from "@/lib/data/documents";
import { ALLOWED_CONTENT } from "@/lib/domain/documents";
import { clientInfo, idParams, parseQuery, route } from "@/lib/server/api";
import { documentOpenQuery } from "@/lib/server/route-schemas";

export const dynamic = "force-dynamic";

/** The document's bytes, for its patient and the staff of its clinic; `?download=1` saves an image instead of showing it. */
export const GET = route<{ params: Promise<{ id: string }> }>(async (req: NextRequest, { params }) => {
  const user = await requireUser();
  const { id } = await idParams(params, "id");
  const download = parseQuery(req, documentOpenQuery).download === "1";
  const doc = await openDocument({ actor: user, documentId: id, download, client: clientInfo(req) });
  // Uploaded files come from outside: only a raster image is shown in the browser, and under a
  // sandboxing policy; a PDF (which can carry scripts and forms) is always saved, never opened here.
  const inline = !download && (ALLOWED_CONTENT as Record<string, { image: boolean }>)[doc.contentType]?.image === true;
  const ascii = doc.fileName.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return new Response(doc.body, {
    headers: {
      "Content-Type": doc.contentType,
      "Content-Length": String(doc.length),
      "Content-Disposition": `${inline ? "inline" : "attachment"}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(doc.fileName)}`,
      // Personal health data: never kept by shared caches or the browser's back-forward cache.
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
      "Content-Security-Policy": "sandbox; default-src 'none'; img-src 'self'; style-src 'unsafe-inline'",
    },
  });
});
