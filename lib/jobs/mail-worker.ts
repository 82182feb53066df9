// The worker loop (started through lib/jobs/worker-main.ts): releases unpaid booking holds and
// sends the e-mail the outbox holds, as it falls due. Several workers may run at once; pg-boss hands each job to one of them and
// the idempotency keys stop double sends.
import { sequelize } from "@/db/sequelize";
import { runDepositRelease } from "./deposit-release";
import { drainMailOnce, getBoss, stopBoss } from "./mail-queue";
import "@/lib/mail/hooks";

const IDLE_MS = Number(process.env.WORKER_POLL_MS ?? 1000);
let stopping = false;
let wake: (() => void) | undefined;

function pause(ms: number) {
  return new Promise<void>((resolve) => {
    const timer = setTimeout(resolve, ms);
    wake = () => (clearTimeout(timer), resolve());
  });
}

async function main() {
  await getBoss({ supervise: true });
  console.log(`Worker started (pid ${process.pid}); polling every ${IDLE_MS} ms.`);
  while (!stopping) {
    try {
      const released = await runDepositRelease();
      if (released) console.log(`Deposits: released ${released} unpaid hold(s).`);
      const r = await drainMailOnce({ shouldStop: () => stopping });
      if (r.queued || r.sent || r.failed || r.skipped || r.duplicate) {
        console.log(`Mail: queued ${r.queued}, sent ${r.sent}, retrying or failed ${r.failed}, skipped ${r.skipped + r.duplicate}.`);
      }
      if (!stopping) await pause(IDLE_MS);
    } catch (err) {
      // The database may be restarting: wait and try again rather than exit.
      console.error("Worker pass failed:", err instanceof Error ? err.message : err);
      if (!stopping) await pause(5000);
    }
  }
  await stopBoss().catch(() => undefined);
  await sequelize.close().catch(() => undefined);
  process.exit(0);
}

// Finish the pass in hand (a message half sent would otherwise wait for its claim to lapse), then exit.
function shutdown(signal: string) {
  if (stopping) return;
  stopping = true;
  wake?.();
  console.log(`Worker stopping (${signal}).`);
  setTimeout(() => process.exit(0), 15_000).unref();
}

process.on("SIGTERM", () => shutdown("SIGTERM"));
process.on("SIGINT", () => shutdown("SIGINT"));

main().catch((err) => {
  console.error("Worker could not start:", err instanceof Error ? err.message : err);
  process.exit(1);
});
