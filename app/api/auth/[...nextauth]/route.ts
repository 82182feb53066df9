import NextAuth from "next-auth";
import type { NextRequest } from "next/server";
import { authOptionsFor } from "@/lib/auth/options";
import { clientIpFrom } from "@/lib/server/client-ip";

type Ctx = { params: Promise<{ nextauth: string[] }> };

// Options per request, so the sign-in link throttle knows the client's IP.
async function handler(req: NextRequest, ctx: Ctx) {
  return NextAuth(req, ctx as never, authOptionsFor(clientIpFrom(req.headers)));
}
export { handler as GET, handler as POST };
