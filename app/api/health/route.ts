import { NextResponse } from "next/server";
import { sequelize } from "@/db/sequelize";

export const dynamic = "force-dynamic";

export async function GET() {
  try {
    await sequelize.query("SELECT 1");
    return NextResponse.json({ ok: true, db: "up" });
  } catch {
    return NextResponse.json({ ok: false, db: "down" }, { status: 503 });
  }
}
