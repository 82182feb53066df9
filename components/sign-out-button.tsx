"use client";

import { signOut } from "next-auth/react";

export function SignOutButton() {
  return (
    <button type="button" className="btn-quiet min-h-10 px-3 text-sm" onClick={() => signOut({ callbackUrl: "/" })}>
      Sign out
    </button>
  );
}
