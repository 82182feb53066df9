import { NextResponse, type NextRequest } from "next/server";
import { requireUser } from "@/lib/auth/session";
import { getMe, updateMe } from "@/lib/data/me";
import { updateMeSchema } from "@/lib/domain/patient-record";
import type { CountryCode } from "libphonenumber-js";
import { clientInfo, readJson, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The signed-in patient's own profile. */
export const GET = route(async () => {
  const user = await requireUser(["patient"]);
  return NextResponse.json({ me: await getMe({ user }) });
});

/** `{ phone?, language?, reminders?, email? }`; a new e-mail is used only once the link sent to it is followed. */
export const PATCH = route(async (req: NextRequest) => {
  const user = await requireUser(["patient"]);
  const before = await getMe({ user });
  const changes = await readJson(req, updateMeSchema(before.clinic.country as CountryCode));
  const { emailPending } = await updateMe({ user, changes, info: clientInfo(req) });
  return NextResponse.json({ me: await getMe({ user }), emailPending });
});
