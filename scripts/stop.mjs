// Stops everything `npm run demo` started: the worker, the mail catcher, the storage fake, the payment fake and PostgreSQL.
import { stopPostgres, stopService } from "./lib.mjs";

for (const name of ["app", "worker", "mail-catcher", "storage", "payment-fake"]) stopService(name);
stopPostgres();
