// Loads the whole demo: the clinic (demo-clinic.ts), then each area's demo records.
import { Clinic, sequelize } from "@/db/models";
import { seedClinic } from "./demo-clinic";
import { seedConsents } from "./demo-consents";
import { seedProposals } from "./demo-proposals";

export async function resetDatabase() {
  const [rows] = await sequelize.query(
    "SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename <> 'schema_migrations'",
  );
  const tables = (rows as { tablename: string }[]).map((r) => `"${r.tablename}"`);
  if (tables.length) await sequelize.query(`TRUNCATE ${tables.join(", ")} RESTART IDENTITY CASCADE`);
}

export async function seedDemo({ reset = false, now = new Date() } = {}): Promise<"kept" | "loaded"> {
  if (reset) await resetDatabase();
  else if (await Clinic.findOne({ where: { slug: "alder-bay" } })) return "kept";
  await sequelize.transaction(async (transaction) => {
    const demo = await seedClinic(transaction);
    const { visits } = await seedProposals(demo, transaction, now);
    void visits; // handed to the consent and day-board seeders below
    await seedConsents(visits, transaction, now);
  });
  return "loaded";
}
