// `npm run db:seed [-- --reset]`: loads the invented demo clinic. Without --reset an existing
// demo clinic is kept as it is; with --reset every migration runs down and up first (as the owner:
// kept records refuse TRUNCATE and DELETE). Refused with NODE_ENV=production.
import "./as-owner";
import { sequelize } from "./sequelize";
import { seedDemo } from "./seed/demo";

async function main() {
  const reset = process.argv.includes("--reset");
  const result = await seedDemo({ reset });
  console.log(result === "kept" ? "Demo clinic already there: kept as it is." : "Demo clinic loaded.");
  await sequelize.close();
}

main().catch((err) => {
  console.error(err instanceof Error ? err.stack : err);
  process.exit(1);
});
