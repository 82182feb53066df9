// The mail queue on pg-boss: due outbox rows become pg-boss jobs (in one transaction with the
// outbox update), and each job delivers one message, retrying with exponential backoff while the
// mail server is unreachable. `drainMailOnce` does one full pass; the worker calls it in a loop,
// and tests and the benchmark call it directly.
import PgBoss from "pg-boss";
import { QueryTypes, type Transaction } from "sequelize";
import type { Transporter } from "nodemailer";
import { sequelize } from "@/db/sequelize";
import { deliverOutboxMessage, type DeliveryResult } from "@/lib/mail/deliver";

export const MAIL_QUEUE = "mail-send";
const RETRY_LIMIT = Number(process.env.MAIL_RETRY_LIMIT ?? 8);
// Seconds before the first retry; pg-boss doubles it each time (with jitter): 30 s … about 2 h in all.
const RETRY_DELAY = Number(process.env.MAIL_RETRY_DELAY_SECONDS ?? 30);

declare global {
  var __cuspalBoss: Promise<PgBoss> | undefined;
}

/** Starts (once per process) the pg-boss client; `supervise` runs pg-boss's maintenance (the worker does). */
export function getBoss({ supervise = false }: { supervise?: boolean } = {}): Promise<PgBoss> {
  globalThis.__cuspalBoss ??= (async () => {
    if (!process.env.DATABASE_URL) throw new Error("DATABASE_URL is not set.");
    // The same database as the Sequelize instance, whatever the environment says now: the
    // outbox and the jobs must live side by side for the hand-over transaction to mean anything.
    const c = sequelize.config;
    const boss = new PgBoss({
      host: c.host,
      port: Number(c.port),
      database: c.database,
      user: c.username,
      password: c.password ?? undefined,
      max: Number(process.env.BOSS_POOL_MAX ?? 4),
      application_name: "cuspal-mail",
      supervise,
      schedule: false,
      // Its schema is installed by migration 0008 as the owner; the app's role may not change it.
      migrate: false,
    });
    boss.on("error", (err) => console.error("Job queue error:", err.message));
    await boss.start();
    await boss.createQueue(MAIL_QUEUE, { name: MAIL_QUEUE, retryLimit: RETRY_LIMIT, retryDelay: RETRY_DELAY, retryBackoff: true, expireInSeconds: 120 });
    return boss;
  })().catch((err) => {
    globalThis.__cuspalBoss = undefined;
    throw err;
  });
  return globalThis.__cuspalBoss;
}

export async function stopBoss() {
  const pending = globalThis.__cuspalBoss;
  globalThis.__cuspalBoss = undefined;
  if (pending) await (await pending).stop({ graceful: true, timeout: 5000 });
}

/** pg-boss's `db` option bound to a Sequelize transaction, so its insert commits with ours. */
function inTransaction(transaction: Transaction): PgBoss.Db {
  return {
    async executeSql(text: string, values: unknown[]) {
      // Sequelize refuses undefined bind values; pg-boss passes undefined for unset defaults.
      const bind = values.map((v) => (v === undefined ? null : v));
      const rows = await sequelize.query(text, { bind, transaction, type: QueryTypes.SELECT });
      return { rows };
    },
  };
}

export type DispatchOptions = {
  now?: Date;
  /** Only this clinic's messages (tests and the benchmark keep to their own clinic). */
  clinicId?: string;
  limit?: number;
  /** Overrides the queue's first retry delay for these jobs (tests). */
  retryDelaySeconds?: number;
};

/** Moves due outbox rows into pg-boss jobs. Returns how many were queued. */
export async function dispatchDue(opts: DispatchOptions = {}): Promise<number> {
  const boss = await getBoss();
  const now = opts.now ?? new Date();
  return sequelize.transaction(async (transaction) => {
    const due = await sequelize.query<{ id: string }>(
      `SELECT id FROM mail_outbox
        WHERE state = 'pending' AND due_at <= $1 AND ($2::uuid IS NULL OR clinic_id = $2::uuid)
        ORDER BY due_at LIMIT $3 FOR UPDATE SKIP LOCKED`,
      { bind: [now, opts.clinicId ?? null, opts.limit ?? 200], transaction, type: QueryTypes.SELECT },
    );
    if (!due.length) return 0;
    const jobs = due.map((r) => ({
      id: r.id, // one job per outbox row: the row id is the job id
      name: MAIL_QUEUE,
      data: { outboxId: r.id },
      ...(opts.retryDelaySeconds ? { retryDelay: opts.retryDelaySeconds } : {}),
    }));
    await boss.insert(jobs, { db: inTransaction(transaction) });
    await sequelize.query(`UPDATE mail_outbox SET state = 'queued', job_id = id, updated_at = now() WHERE id = ANY($1::uuid[])`, {
      bind: [due.map((r) => r.id)],
      transaction,
    });
    return due.length;
  });
}

export type ProcessOptions = { transport?: Transporter; now?: Date; batchSize?: number; concurrency?: number };
export type ProcessTally = Record<DeliveryResult | "failed", number>;

/** Fetches the jobs that are ready now and delivers them. */
export async function processReady(opts: ProcessOptions = {}): Promise<ProcessTally> {
  const boss = await getBoss();
  const tally: ProcessTally = { sent: 0, skipped: 0, duplicate: 0, gone: 0, failed: 0 };
  const jobs = await boss.fetch<{ outboxId: string }>(MAIL_QUEUE, { batchSize: opts.batchSize ?? 20, includeMetadata: true });
  const queue = [...jobs];
  const finished: string[] = [];
  const retry: string[] = [];
  const run = async () => {
    for (let job = queue.shift(); job; job = queue.shift()) {
      try {
        const result = await deliverOutboxMessage(job.data.outboxId, {
          attempt: job.retryCount + 1,
          finalAttempt: job.retryCount >= job.retryLimit,
          transport: opts.transport,
          now: opts.now,
        });
        tally[result] += 1;
        finished.push(job.id);
      } catch (err) {
        tally.failed += 1;
        retry.push(job.id);
        // Ids and error codes only: SMTP messages can quote addresses.
        const e = err as { name?: string; code?: string };
        if (e.name !== "SendInProgress") console.error(`Mail job ${job.id} failed: ${e.name ?? "Error"}${e.code ? ` (${e.code})` : ""}`);
      }
    }
  };
  await Promise.all(Array.from({ length: Math.min(opts.concurrency ?? 4, jobs.length) }, run));
  // One call for the batch (outcomes are in mail_attempts). A crash before this point leaves the
  // jobs active; pg-boss expires and retries them, and the idempotency keys make that a no-op.
  if (finished.length) await boss.complete(MAIL_QUEUE, finished);
  // pg-boss schedules each retry with exponential backoff, or marks the job failed after the last.
  if (retry.length) await boss.fail(MAIL_QUEUE, retry);
  return tally;
}

export type DrainResult = ProcessTally & { queued: number };
export type DrainOptions = DispatchOptions & ProcessOptions & { shouldStop?: () => boolean };

/** One full pass: queue everything due, then deliver until no job is ready (retries wait for their time). */
export async function drainMailOnce(opts: DrainOptions = {}): Promise<DrainResult> {
  const total: DrainResult = { queued: 0, sent: 0, skipped: 0, duplicate: 0, gone: 0, failed: 0 };
  for (;;) {
    const queued = await dispatchDue(opts);
    const tally = await processReady(opts);
    total.queued += queued;
    for (const k of Object.keys(tally) as (keyof ProcessTally)[]) total[k] += tally[k];
    const handled = Object.values(tally).reduce((a, b) => a + b, 0);
    if ((!queued && !handled) || opts.shouldStop?.()) return total;
  }
}
