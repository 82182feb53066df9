import { NextResponse } from "next/server";
import { sequelize } from "@/db/sequelize";

export const dynamic = "force-dynamic";

const NO_STORE = { "Cache-Control": "no-store" };

export async function GET() {
  try {
    await sequelize.query("SELECT 1");
    return NextResponse.json({ ok: true, db: "up" }, { headers: NO_STORE });
  } catch {
    return NextResponse.json({ ok: false, db: "down" }, { status: 503, headers: NO_STORE });
  }
}
