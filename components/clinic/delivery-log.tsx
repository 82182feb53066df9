// Reception's view of the e-mail about one visit: what was sent, what is scheduled, what is
// retrying or failed, with every attempt. A server component; place it on the staff visit page.
import { requirePageUser, STAFF_ROLES } from "@/lib/auth/session";
import { getDeliveryLog, type DeliveryStatus } from "@/lib/data/mail";
import { shortWhen } from "@/lib/domain/visit-when";
import { AppError } from "@/lib/server/errors";

// Colour always comes with the status word.
const STATUS: Record<DeliveryStatus, { word: string; className: string }> = {
  sent: { word: "Sent", className: "border-sage-600 bg-sage-50 text-sage-700" },
  scheduled: { word: "Scheduled", className: "border-harbour-600 bg-harbour-50 text-harbour-800" },
  sending: { word: "Sending", className: "border-harbour-600 bg-harbour-50 text-harbour-800" },
  retrying: { word: "Retrying", className: "border-ochre-600 bg-ochre-50 text-ochre-700" },
  failed: { word: "Failed", className: "border-clay-600 bg-clay-50 text-clay-700" },
  skipped: { word: "Not sent", className: "border-line bg-paper text-ink-soft" },
  withdrawn: { word: "Withdrawn", className: "border-line bg-paper text-ink-soft" },
};

const OUTCOME: Record<string, string> = { sent: "sent", retrying: "failed, will retry", failed: "failed, no more retries", skipped: "not sent" };

export async function DeliveryLog({ appointmentId }: { appointmentId: string }) {
  const user = await requirePageUser(STAFF_ROLES);
  let log: Awaited<ReturnType<typeof getDeliveryLog>>;
  try {
    log = await getDeliveryLog({ user, appointmentId });
  } catch (err) {
    if (err instanceof AppError && err.status < 500) return null;
    throw err;
  }
  const zone = log.timeZone;
  return (
    <section className="card space-y-3" aria-labelledby="delivery-log-title" data-testid="delivery-log">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="delivery-log-title" className="text-lg font-semibold">E-mail to the patient</h2>
        <p className="text-sm text-ink-soft">Reminders {log.remindersEnabled ? "on" : "off (turned off by the patient)"}</p>
      </div>
      {log.entries.length === 0 ? (
        <p className="text-sm text-ink-soft">No e-mail about this visit yet.</p>
      ) : (
        <ul className="divide-y divide-line">
          {log.entries.map((e) => {
            const s = STATUS[e.status];
            const time =
              e.status === "scheduled" ? `due ${shortWhen(e.dueAt, zone)}`
              : e.lastAt ? shortWhen(e.lastAt, zone)
              : shortWhen(e.dueAt, zone);
            return (
              <li key={e.id} className="py-2 first:pt-0 last:pb-0" data-testid="delivery-entry" data-status={e.status}>
                <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
                  <span className="font-medium">{e.label}</span>
                  <span className={`chip ${s.className}`}>{s.word}</span>
                  <span className="text-sm text-ink-soft">{time}</span>
                </div>
                {e.note && e.status !== "sent" ? <p className="text-sm text-ink-soft">{e.note}</p> : null}
                {e.attempts.length > 0 ? (
                  <details className="mt-1 text-sm">
                    <summary className="inline-flex min-h-6 cursor-pointer items-center text-harbour-700">
                      {e.attempts.length} attempt{e.attempts.length === 1 ? "" : "s"}
                    </summary>
                    <ol className="mt-1 space-y-0.5 pl-4">
                      {e.attempts.map((a) => (
                        <li key={`${a.attempt}-${a.at.toISOString()}`}>
                          Attempt {a.attempt}, {shortWhen(a.at, zone)}: {OUTCOME[a.outcome] ?? a.outcome}
                          {a.detail && a.outcome !== "sent" ? ` (${a.detail})` : ""}
                        </li>
                      ))}
                    </ol>
                  </details>
                ) : null}
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
