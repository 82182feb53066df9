// Who is asking: used by every page, route handler and server action before touching data.
import "server-only";
import { getServerSession, type Session } from "next-auth";
import { redirect } from "next/navigation";
import type { Role } from "@/db/models/user";
import { forbidden, unauthorised } from "@/lib/server/errors";
import { authOptions } from "./options";

export type SessionUser = Session["user"];
export const STAFF_ROLES: Role[] = ["reception", "dentist", "admin"];

export async function currentUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions);
  return session?.user ?? null;
}

/** For route handlers and server actions: throws 401/403 as an AppError. */
export async function requireUser(roles?: readonly Role[]): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) throw unauthorised();
  if (roles && !roles.includes(user.role)) throw forbidden();
  return user;
}

/** For pages and layouts: redirects instead of throwing. */
export async function requirePageUser(roles: readonly Role[]): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  if (!roles.includes(user.role)) redirect(homeFor(user.role));
  return user;
}

export function homeFor(role: Role): string {
  return role === "patient" ? "/patient" : "/clinic";
}
