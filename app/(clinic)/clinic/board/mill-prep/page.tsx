import type { Metadata } from "next";
import Link from "next/link";
import { CautionsNote } from "@/components/cautions-note";
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { loadMillPrep } from "@/lib/data/mill-prep";
import { localTime } from "@/lib/domain/time-zone";
import { BlockForm, LoadedButton } from "./block-forms";

export const metadata: Metadata = { title: "Mill preparation" };
export const dynamic = "force-dynamic";

const STATE_TEXT = { loaded: "Loaded", due: "To load", late: "Late: load now", cut: "Milled" } as const;
const STATE_CLASS = { loaded: "bg-sage-50 text-sage-700", due: "bg-paper-deep text-ink", late: "bg-clay-50 text-clay-700", cut: "bg-white text-ink-muted" } as const;

/** Which block goes into which mill before each visit's fabrication, and by when; follows the day's real times. */
export default async function MillPrepPage({ searchParams }: { searchParams: Promise<{ day?: string }> }) {
  const user = await requirePageUser(STAFF_ROLES);
  const { day } = await searchParams;
  const prep = await loadMillPrep({ user, day: day && /^\d{4}-\d{2}-\d{2}$/.test(day) ? day : null });
  const t = (ms: number) => localTime(new Date(ms), prep.timezone);
  return (
    <div className="space-y-4">
      <p><Link href={`/clinic/board?day=${prep.day}`}>← Day board</Link></p>
      <h1 className="text-2xl font-bold">Mill preparation, {prep.day}</h1>
      <p className="text-ink-soft">
        Load each block before the design is done, so the mill can start at once. Times follow the day as it runs: a late stage moves them.
        Check the block against the material, shade and size before loading it.
      </p>
      {prep.mills.map((mill) => (
        <section key={mill.id} className="card space-y-3" aria-labelledby={`mill-${mill.id}`}>
          <h2 id={`mill-${mill.id}`} className="text-lg font-bold">{mill.name}</h2>
          {mill.items.length === 0 ? <p className="text-sm text-ink-muted">Nothing to mill on this day.</p> : (
            <ol className="divide-y divide-line">
              {mill.items.map((item) => {
                const label = `${item.initials}, tooth ${item.tooth}`;
                return (
                  <li key={item.id} className="space-y-2 py-3" data-testid={`prep-${item.id}`}>
                    <div className="flex flex-wrap items-baseline justify-between gap-2">
                      <p className="font-semibold">{label} · {item.material} · shade {item.shade ?? "not recorded"} · block {item.blockSize ?? "size not recorded"}</p>
                      <span className={`rounded-full px-2 py-0.5 text-sm font-semibold ${STATE_CLASS[item.state]}`} data-testid="prep-state">{STATE_TEXT[item.state]}</span>
                    </div>
                    <p className="text-sm">
                      Load {item.loadFrom !== null ? `between ${t(item.loadFrom)} and ` : "by "}<strong>{t(item.loadBy)}</strong>; milling {t(item.fabricationStart)}–{t(item.fabricationEnd)}.
                      {item.lots.length ? ` Lot ${item.lots.join(", ")}.` : " No lot recorded yet."}
                    </p>
                    {item.missing.length ? <p className="text-sm text-clay-700">The dentist has not recorded the {item.missing.join(" or the ")}.</p> : null}
                    <div className="flex flex-wrap items-end gap-4">
                      {item.state !== "cut" ? <LoadedButton appointmentId={item.id} loaded={item.state === "loaded"} label={label} /> : null}
                      {item.state !== "cut" && ["dentist", "admin"].includes(user.role) ? <BlockForm appointmentId={item.id} shade={item.shade} blockSize={item.blockSize} label={label} /> : null}
                    </div>
                  </li>
                );
              })}
            </ol>
          )}
        </section>
      ))}
      <CautionsNote />
    </div>
  );
}
