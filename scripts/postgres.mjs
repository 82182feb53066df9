// `npm run db:start` / `npm run db:stop`: the project's own PostgreSQL on 127.0.0.1.
import { ensureDatabases, ensureDependencies, ensurePostgres, stopPostgres } from "./lib.mjs";

if (process.argv[2] === "stop") stopPostgres();
else {
  ensureDependencies();
  await ensurePostgres();
  await ensureDatabases(["cuspal", "cuspal_test"]);
}
