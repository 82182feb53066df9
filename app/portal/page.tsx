import { redirect } from "next/navigation";
import { currentUser, homeFor, TWO_FACTOR_SETUP_PATH } from "@/lib/auth/session";

export const dynamic = "force-dynamic";

/** After sign-in: send each role to its own home. */
export default async function PortalPage() {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  // Staff whose clinic requires two-factor sign-in set it up before anything else.
  redirect(user.setupTwoFactor ? TWO_FACTOR_SETUP_PATH : homeFor(user.role));
}
