import { NextResponse, type NextRequest } from "next/server";
import { confirmEmailChange } from "@/lib/data/me";
import { AppError } from "@/lib/server/errors";
import { clientInfo, route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The link e-mailed to a new address: confirms it, then shows the outcome on the profile page. */
export const GET = route(async (req: NextRequest) => {
  const token = req.nextUrl.searchParams.get("token") ?? "";
  const target = new URL("/patient/profile", req.nextUrl.origin);
  try {
    await confirmEmailChange({ token, info: clientInfo(req) });
    target.searchParams.set("notice", "email-changed");
  } catch (err) {
    if (!(err instanceof AppError)) throw err;
    target.searchParams.set("notice", err.status === 409 ? "email-taken" : "email-link-expired");
  }
  return NextResponse.redirect(target, 303);
});
