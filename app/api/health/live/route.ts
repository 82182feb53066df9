import { NextResponse } from "next/server";

export const dynamic = "force-dynamic";

/** Liveness: the process answers. Touches no database, so a load balancer can tell a hung app from a lost database. */
export async function GET() {
  return NextResponse.json({ ok: true }, { headers: { "Cache-Control": "no-store" } });
}
