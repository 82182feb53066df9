import { NextResponse, type NextRequest } from "next/server";
import { requireUser, STAFF_ROLES } from "@/lib/auth/session";
import { invitePatient } from "@/lib/data/patient-invitations";
import { clientInfo, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** E-mails the patient a one-time sign-in link (72 h); a new one replaces the old. 429 past the hourly limit. */
export const POST = route<{ params: Promise<{ id: string }> }>(async (req: NextRequest, { params }) => {
  const user = await requireUser(STAFF_ROLES);
  const { id } = await params;
  const { expiresAt } = await invitePatient({ user, patientId: id, info: clientInfo(req) });
  return NextResponse.json({ expiresAt }, { status: 202 });
});
