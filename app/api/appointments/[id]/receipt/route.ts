import { requireUser } from "@/lib/auth/session";
import { getDepositReceipt } from "@/lib/data/payments";
import { idParams, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The deposit receipt as a PDF, for the visit's patient and the clinic's staff; 404 before a payment. */
export const GET = route<{ params: Promise<{ id: string }> }>(async (_req, { params }) => {
  const user = await requireUser();
  const { id } = await idParams(params, "id");
  const { bytes, filename } = await getDepositReceipt({ user }, id);
  return new Response(Buffer.from(bytes), {
    headers: { "content-type": "application/pdf", "content-disposition": `attachment; filename="${filename}"`, "cache-control": "private, no-store" },
  });
});
