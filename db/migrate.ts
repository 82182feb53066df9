// Runs the migrations in db/migrations with umzug: `tsx db/migrate.ts up|down [--to NAME]`.
import "./as-owner";
import { sequelize } from "./sequelize";
import { migrator } from "./migrator";

async function main() {
  const [command = "up", flag, target] = process.argv.slice(2);
  const umzug = migrator(sequelize);
  if (command === "up") {
    const done = await umzug.up();
    console.log(done.length ? `Applied ${done.map((m) => m.name).join(", ")}` : "Database is up to date.");
  } else if (command === "down") {
    const done = await umzug.down(flag === "--to" ? { to: target === "0" ? 0 : target } : undefined);
    console.log(done.length ? `Reverted ${done.map((m) => m.name).join(", ")}` : "Nothing to revert.");
  } else {
    throw new Error(`Unknown command "${command}": use up or down.`);
  }
  await sequelize.close();
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
