import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { DayBoard } from "./day-board";

export const metadata: Metadata = { title: "Day board" };

export default async function DayBoardPage({ searchParams }: { searchParams: Promise<{ day?: string }> }) {
  await requirePageUser(STAFF_ROLES);
  const { day } = await searchParams;
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h1 className="text-2xl font-bold">Day board</h1>
        <span className="flex flex-wrap gap-4">
          <Link href={`/clinic/board/mill-prep${day && /^\d{4}-\d{2}-\d{2}$/.test(day) ? `?day=${day}` : ""}`} className="inline-flex min-h-6 items-center text-sm font-semibold">Mill preparation</Link>
          <Link href="/clinic/board/equipment" className="inline-flex min-h-6 items-center text-sm font-semibold">Equipment status</Link>
        </span>
      </div>
      <DayBoard initialDay={day && /^\d{4}-\d{2}-\d{2}$/.test(day) ? day : null} />
    </div>
  );
}
