// The few reads nearly every request makes (the session's account, a proposal, a clinic's row and
// settings version, what is busy) go straight to the pool's pg client: Sequelize's query pipeline
// costs about 0.2 ms of CPU per query, the driver alone about 0.08 (measured on the benchmark
// database). Same pool, same type parsers, the caller's transaction when one is given; errors from
// PostgreSQL come out as Sequelize's DatabaseError, so callers and lib/server/db-errors.ts treat
// them as before.
import { DatabaseError, type Transaction } from "sequelize";
import { sequelize } from "./sequelize";

type Client = { query(text: string, values: unknown[]): Promise<{ rows: unknown[] }> };
type Pool = { getConnection(options: { type: "read" | "write" }): Promise<Client>; releaseConnection(client: Client): Promise<void> | void };

/** Rows of one parameterised SELECT ($1, $2…). */
export async function selectRows<T>(text: string, values: unknown[], transaction?: Transaction | null): Promise<T[]> {
  try {
    if (transaction) return (await (transaction as unknown as { connection: Client }).connection.query(text, values)).rows as T[];
    const pool = sequelize.connectionManager as unknown as Pool;
    // "write": the primary, so a request reads what it has just written even when replicas exist.
    const client = await pool.getConnection({ type: "write" });
    try {
      return (await client.query(text, values)).rows as T[];
    } finally {
      await pool.releaseConnection(client);
    }
  } catch (err) {
    // PostgreSQL's own errors carry a SQLSTATE `code` and a `severity`.
    const fromServer = err instanceof Error && typeof (err as { code?: unknown }).code === "string" && "severity" in err;
    throw fromServer && !(err instanceof DatabaseError) ? new DatabaseError(Object.assign(err as Error, { sql: text }) as unknown as ConstructorParameters<typeof DatabaseError>[0]) : err;
  }
}
