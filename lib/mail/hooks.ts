// The mail side's entry point: loading it attaches the visit e-mail hooks to the Appointment model,
// so every visit change writes its outbox rows in the change's own transaction. The modules that
// change visits (booking, the day board, the reminder switch), the worker and the seed import it;
// the models themselves know nothing of e-mail. Next bundles each route into its own module graph
// with its own copy of the models, so this runs once per copy (re-running replaces the hooks).
import { Appointment } from "@/db/models";
import { registerVisitMailHooks } from "./visit-hooks";

registerVisitMailHooks(Appointment);

export {};
