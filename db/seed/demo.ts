// Loads the whole demo: the clinic (demo-clinic.ts), then each area's demo records.
import { Clinic, sequelize } from "@/db/models";
import { migrator } from "@/db/migrator";
import { seedClinic } from "./demo-clinic";
import { seedConsents } from "./demo-consents";
import { seedProposals } from "./demo-proposals";
import "@/lib/mail/hooks";

export const DEMO_IN_PRODUCTION_MESSAGE =
  "Refusing to load the demo clinic with NODE_ENV=production: its accounts share a published password.";

/**
 * Empties the database by running every migration down and up again. Consents, sealed PDFs and
 * the audit trail refuse TRUNCATE and DELETE even for the owner, so dropping the tables is the
 * only way; it needs the owner's connection (OWNER_DATABASE_URL). Queued jobs go too.
 */
export async function resetDatabase() {
  const umzug = migrator(sequelize);
  await umzug.down({ to: 0 });
  await umzug.up();
  await sequelize.query("DELETE FROM pgboss.job; DELETE FROM pgboss.archive;");
}

export async function seedDemo({ reset = false, now = new Date() } = {}): Promise<"kept" | "loaded"> {
  if (process.env.NODE_ENV === "production") throw new Error(DEMO_IN_PRODUCTION_MESSAGE);
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
