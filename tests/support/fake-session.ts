// A stand-in for next-auth's session in integration tests that call route handlers directly:
// `vi.mock("@/lib/auth/session", async () => (await import("../support/fake-session")).sessionModule())`,
// then set `auth.user`.
import type { SessionUser } from "@/lib/auth/session";
import { forbidden, unauthorised } from "@/lib/server/errors";

export const auth: { user: SessionUser | null } = { user: null };

export function sessionModule() {
  return {
    STAFF_ROLES: ["reception", "dentist", "admin"],
    currentUser: async () => auth.user,
    requireUser: async (roles?: readonly string[]) => {
      if (!auth.user) throw unauthorised();
      if (roles && !roles.includes(auth.user.role)) throw forbidden();
      return auth.user;
    },
    requirePageUser: async () => auth.user,
    homeFor: (role: string) => (role === "patient" ? "/patient" : "/clinic"),
  };
}
