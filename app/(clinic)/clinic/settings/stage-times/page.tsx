import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser } from "@/lib/auth/session";
import { stageTimeStats } from "@/lib/data/progress";
import { stageLabel } from "@/lib/domain/timeline";

export const metadata: Metadata = { title: "Estimated against actual" };

export default async function StageTimesPage() {
  const user = await requirePageUser(["admin"]);
  const rows = await stageTimeStats({ clinicId: user.clinicId! });
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Estimated against actual stage times</h1>
      <p className="text-ink-soft">
        From the start and finish times staff record on visits. The middle half is where half of the real times fall;
        when the median is far from the estimate, adjust the <Link href="/clinic/settings/durations" className="inline-flex min-h-6 items-center">stage durations</Link>.
      </p>
      <section className="card overflow-x-auto">
        {rows.length === 0 ? (
          <p className="text-ink-soft">No finished stages recorded yet.</p>
        ) : (
          <table className="w-full text-left text-sm" data-testid="stage-times">
            <caption className="sr-only">Estimated against actual minutes per material, mode and stage</caption>
            <thead>
              <tr className="border-b border-line">
                <th scope="col" className="py-2 pr-3">Material and mode</th><th scope="col" className="py-2 pr-3">Stage</th>
                <th scope="col" className="py-2 pr-3">Visits</th><th scope="col" className="py-2 pr-3">Estimated</th>
                <th scope="col" className="py-2 pr-3">Median actual</th><th scope="col" className="py-2 pr-3">Middle half</th>
                <th scope="col" className="py-2 pr-3">Shortest–longest</th><th scope="col" className="py-2 pr-3">Setting now</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => {
                const gap = r.medianMinutes - r.estimatedMinutes;
                return (
                  <tr key={`${r.materialId}-${r.mode}-${r.stage}`} className="border-b border-line">
                    <td className="py-1 pr-3">{r.material} · {r.mode}</td>
                    <td className="py-1 pr-3">{stageLabel(r.stage)}</td>
                    <td className="py-1 pr-3 tabular-nums">{r.count}</td>
                    <td className="py-1 pr-3 tabular-nums">{r.estimatedMinutes} min</td>
                    <td className="py-1 pr-3 tabular-nums">
                      {r.medianMinutes} min{" "}
                      {Math.abs(gap) >= 1 ? <span className={gap > 0 ? "text-clay-700" : "text-sage-700"}>({gap > 0 ? "+" : "−"}{Math.abs(Math.round(gap * 10) / 10)})</span> : null}
                    </td>
                    <td className="py-1 pr-3 tabular-nums">{r.q1Minutes}–{r.q3Minutes} min</td>
                    <td className="py-1 pr-3 tabular-nums">{r.minMinutes}–{r.maxMinutes} min</td>
                    <td className="py-1 pr-3 tabular-nums">{r.currentMinutes === null ? "—" : `${r.currentMinutes} min`}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
