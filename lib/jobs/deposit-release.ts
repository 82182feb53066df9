// The hold-release job on pg-boss: at most one run every few seconds across all workers (a singleton job),
// each releasing unpaid bookings older than the hold (lib/payments/deposits.ts releaseUnpaidHolds).
import { getBoss } from "./mail-queue";
import { releaseUnpaidHolds } from "@/lib/payments/release";

export const RELEASE_QUEUE = "deposit-release";
let created = false;

/** Queues the next run (a no-op while one is queued this minute) and runs whatever is ready. */
export async function runDepositRelease(now = new Date()): Promise<number> {
  const boss = await getBoss();
  if (!created) {
    await boss.createQueue(RELEASE_QUEUE, { name: RELEASE_QUEUE, retryLimit: 3, retryDelay: 30, expireInSeconds: 120 });
    created = true;
  }
  await boss.send(RELEASE_QUEUE, {}, { singletonKey: RELEASE_QUEUE, singletonSeconds: 5 });
  const jobs = await boss.fetch(RELEASE_QUEUE, { batchSize: 1 });
  let released = 0;
  for (const job of jobs) {
    try {
      released += await releaseUnpaidHolds({ now });
      await boss.complete(RELEASE_QUEUE, job.id);
    } catch (err) {
      await boss.fail(RELEASE_QUEUE, job.id);
      throw err;
    }
  }
  return released;
}
