import { redirect } from "next/navigation";
import { currentUser, homeFor } from "@/lib/auth/session";

export const dynamic = "force-dynamic";

/** After sign-in: send each role to its own home. */
export default async function PortalPage() {
  const user = await currentUser();
  redirect(user ? homeFor(user.role) : "/sign-in");
}
