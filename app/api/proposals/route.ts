import { NextResponse } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { proposalSchema } from "@/lib/booking/schemas";
import { createProposal, listProposals } from "@/lib/data/proposals";
import { clientInfo, readJson, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** A patient's own proposals, or all of the staff member's clinic. */
export const GET = route(async () => {
  const user = await requireUser();
  return NextResponse.json({ proposals: await listProposals({ user }) });
});

/** The dentist proposes a crown (the clinic manager may too, naming the dentist). */
export const POST = route(async (req) => {
  const user = await requireUser(["dentist", "admin"]);
  const input = await readJson(req, proposalSchema);
  const proposal = await createProposal({ user, input, ...clientInfo(req) });
  return NextResponse.json({ id: proposal.id }, { status: 201 });
});
