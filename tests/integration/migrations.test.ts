// Migrations run down and up cleanly on an empty database (its own database, so other tests are not disturbed).
import pg from "pg";
import { Sequelize } from "sequelize";
import { afterAll, describe, expect, it } from "vitest";
import { migrator } from "@/db/migrator";

const url = process.env.MIGRATIONS_DATABASE_URL;
const sequelize = new Sequelize(url ?? "postgres://unset@127.0.0.1:1/none", { dialect: "postgres", dialectModule: pg, logging: false });

async function tables(): Promise<string[]> {
  const [rows] = await sequelize.query("SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename");
  return (rows as { tablename: string }[]).map((r) => r.tablename).filter((t) => t !== "schema_migrations");
}

describe.skipIf(!url)("migrations", () => {
  afterAll(() => sequelize.close());

  it("apply on an empty database, revert completely, and apply again", async () => {
    const umzug = migrator(sequelize);
    await umzug.down({ to: 0 });
    expect(await tables()).toEqual([]);

    const applied = await umzug.up();
    expect(applied.length).toBeGreaterThanOrEqual(2);
    const after = await tables();
    for (const t of ["clinics", "users", "patients", "audit_events", "appointments", "reservations"]) expect(after).toContain(t);

    const reverted = await umzug.down({ to: 0 });
    expect(reverted.length).toBe(applied.length);
    expect(await tables()).toEqual([]);

    await umzug.up();
    expect(await tables()).toEqual(after);
    expect(await umzug.pending()).toEqual([]);
  });
});
