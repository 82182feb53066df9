// The one fake session for tests: `sessionOf` turns a user row into what the app's session holds,
// and `fakeSessionModule` stands in for @/lib/auth/session in tests that call route handlers:
//
//   vi.mock("@/lib/auth/session", async () => (await import("../support/session")).fakeSessionModule());
//   signInAs(user); … signOut();
import type { SessionUser } from "@/lib/auth/session";

export type Person = { id: string; email: string; name: string | null; role: SessionUser["role"]; clinicId: string | null };

export const sessionOf = (u: Person): SessionUser => ({ id: u.id, email: u.email, name: u.name, role: u.role, clinicId: u.clinicId });

const state: { user: SessionUser | null } = { user: null };

export function signInAs(u: Person): SessionUser {
  state.user = sessionOf(u);
  return state.user;
}

/** Signs in an already-built session user (or none). */
export function setSessionUser(u: SessionUser | null) {
  state.user = u;
}

export function signOut() {
  state.user = null;
}

/** What @/lib/auth/session exports that route handlers use, answering from `signInAs`. */
export async function fakeSessionModule() {
  const { forbidden, unauthorised } = await import("@/lib/server/errors");
  return {
    STAFF_ROLES: ["reception", "dentist", "admin"],
    currentUser: async () => state.user,
    requireUser: async (roles?: readonly string[]) => {
      if (!state.user) throw unauthorised();
      if (roles && !roles.includes(state.user.role)) throw forbidden();
      return state.user;
    },
    requirePageUser: async () => state.user,
    homeFor: (role: string) => (role === "patient" ? "/patient" : "/clinic"),
  };
}

/** Whoever `signInAs` signed in last (null after `signOut`). */
export const signedInUser = () => state.user;
