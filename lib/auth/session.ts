// Who is asking: used by every page, route handler and server action before touching data.
// Reading the session checks the account's row each time (`sessionProblem`, as next-auth's `jwt`
// callback does), so a turned-off account or a changed role is refused on its next request.
import "server-only";
import type { Session } from "next-auth";
import { getToken } from "next-auth/jwt";
import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";
import type { Role } from "@/db/models/user";
import { AppError, forbidden, unauthorised } from "@/lib/server/errors";
import { accountState } from "./account";
import { mustSetUpTwoFactor, sessionProblem } from "./options";
import { decodeSessionToken } from "./session-token";

export type SessionUser = Session["user"];
export const STAFF_ROLES: Role[] = ["reception", "dentist", "admin"];
export const TWO_FACTOR_SETUP_PATH = "/two-factor";

type Options = {
  /** Let staff who still have to set up two-factor sign-in through (the set-up itself, signing out). */
  allowSetup?: boolean;
};

// Once per request for pages (layout and page share it); route handlers call it once anyway.
// The cookie is decoded directly and checked with one primary-key query: the same checks as
// next-auth's `jwt` callback, without building next-auth's whole request handler (which
// getServerSession does, and which cannot renew the cookie from here anyway).
const readSession = cache(async (): Promise<SessionUser | null> => {
  const token = await getToken({ req: { cookies: await cookies(), headers: {} } as unknown as Parameters<typeof getToken>[0]["req"], decode: decodeSessionToken });
  if (!token?.sub) return null;
  const state = await accountState(token.sub);
  if (sessionProblem(token, state)) return null;
  return {
    id: token.sub,
    email: token.email ?? "",
    name: token.name ?? null,
    role: state!.role,
    clinicId: state!.clinicId,
    setupTwoFactor: mustSetUpTwoFactor(state!),
  };
});

export async function currentUser(): Promise<SessionUser | null> {
  return readSession();
}

/** For route handlers and server actions: throws 401/403 as an AppError. */
export async function requireUser(roles?: readonly Role[], options: Options = {}): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) throw unauthorised();
  if (roles && !roles.includes(user.role)) throw forbidden();
  if (user.setupTwoFactor && !options.allowSetup) {
    throw new AppError(403, "Set up two-factor sign-in first: your clinic requires it.", { code: "two_factor_setup" });
  }
  return user;
}

/** For pages and layouts: redirects instead of throwing. */
export async function requirePageUser(roles: readonly Role[], options: Options = {}): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  if (!roles.includes(user.role)) redirect(homeFor(user.role));
  if (user.setupTwoFactor && !options.allowSetup) redirect(TWO_FACTOR_SETUP_PATH);
  return user;
}

export function homeFor(role: Role): string {
  return role === "patient" ? "/patient" : "/clinic";
}
