// Who is asking: used by every page, route handler and server action before touching data.
// Reading the session checks the account's row each time (lib/auth/options.ts, `jwt`), so a
// turned-off account or a changed role is refused on its next request.
import "server-only";
import { getServerSession, type Session } from "next-auth";
import { redirect } from "next/navigation";
import { cache } from "react";
import type { Role } from "@/db/models/user";
import { AppError, forbidden, unauthorised } from "@/lib/server/errors";
import { authOptions } from "./options";

export type SessionUser = Session["user"];
export const STAFF_ROLES: Role[] = ["reception", "dentist", "admin"];
export const TWO_FACTOR_SETUP_PATH = "/two-factor";

type Options = {
  /** Let staff who still have to set up two-factor sign-in through (the set-up itself, signing out). */
  allowSetup?: boolean;
};

// Once per request for pages (layout and page share it); route handlers call it once anyway.
const readSession = cache(async (): Promise<SessionUser | null> => {
  const session = await getServerSession(authOptions);
  return session?.user?.id ? session.user : null;
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
