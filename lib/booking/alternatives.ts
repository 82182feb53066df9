// The nearest free times offered after a lost booking race. Many requests lose the same race at
// once; the first of them computes the answer under a transaction-scoped advisory lock and stores
// it in PostgreSQL for a few seconds; later ones read it with one plain query, and those that
// arrived meanwhile wait for the lock and read it. Alternatives
// are suggestions: the booking itself stays guarded by the reservations' exclusion constraint.
import { QueryTypes, type Transaction } from "sequelize";
import { selectRows } from "@/db/select-rows";
import { sequelize } from "@/db/sequelize";

/** How long a computed answer is reused. */
const FRESH_SECONDS = 5;

export type Alternative = { start: string; end: string };

export async function sharedAlternatives(key: string, compute: (transaction: Transaction) => Promise<Alternative[]>): Promise<Alternative[]> {
  // Most losers of a race find the answer already there: one read, no transaction, no lock.
  const ready = await freshAnswer(key);
  if (ready) return ready;
  return sequelize.transaction(async (transaction) => {
    await sequelize.query(`SELECT pg_advisory_xact_lock(hashtextextended(:key, 0)) AS locked`, { replacements: { key: `alternatives ${key}` }, type: QueryTypes.SELECT, transaction });
    return (await freshAnswer(key, transaction)) ?? computeAndKeep(transaction, key, compute);
  });
}

async function freshAnswer(key: string, transaction?: Transaction): Promise<Alternative[] | null> {
  // clock_timestamp, not now(): a waiter's transaction began before the answer it is about to read.
  const [fresh] = await selectRows<{ alternatives: Alternative[] }>(
    `SELECT alternatives FROM booking_alternatives WHERE key = $1 AND computed_at > clock_timestamp() - make_interval(secs => $2)`,
    [key, FRESH_SECONDS],
    transaction,
  );
  return fresh?.alternatives ?? null;
}

async function computeAndKeep(transaction: Transaction, key: string, compute: (transaction: Transaction) => Promise<Alternative[]>): Promise<Alternative[]> {
  const alternatives = await compute(transaction);
  await sequelize.query(
    `INSERT INTO booking_alternatives (key, computed_at, alternatives) VALUES (:key, clock_timestamp(), :alternatives::jsonb)
     ON CONFLICT (key) DO UPDATE SET computed_at = EXCLUDED.computed_at, alternatives = EXCLUDED.alternatives`,
    { replacements: { key, alternatives: JSON.stringify(alternatives) }, transaction },
  );
  // Old answers are useless; a few computations in a hundred clear them out.
  if (Math.random() < 0.05) {
    await sequelize.query(`DELETE FROM booking_alternatives WHERE computed_at < clock_timestamp() - interval '10 minutes'`, { transaction });
  }
  return alternatives;
}
