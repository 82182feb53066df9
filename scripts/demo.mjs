// `npm run demo`: everything a fresh machine needs to show Cuspal with its invented demo clinic.
import { spawn } from "node:child_process";
import {
  appEnv, appServerCommand, bin, buildWorker, ensureDatabases, ensureDependencies, ensurePostgres, mustRun, root, say,
  startMailCatcher, startPaymentFake, startService, startStorage,
} from "./lib.mjs";

const appPort = Number(process.env.PORT ?? 3000);
const ports = { db: "cuspal", appPort, smtpPort: 1025, mailWebPort: 1080, s3Port: 4569, paymentPort: 12111 };

ensureDependencies();
await ensurePostgres();
await ensureDatabases(["cuspal", "cuspal_test"]);
const env = { ...process.env, ...appEnv(ports) };

say("Migrating the database…");
mustRun(bin("tsx"), ["db/migrate.ts", "up"], { env });
mustRun(bin("tsx"), ["scripts/make-seal-certificate.ts"], { env }, "Creating the clinic seal certificate");
say("Loading the demo clinic (kept if already there)…");
mustRun(bin("tsx"), ["db/seed.ts"], { env });

await startMailCatcher({ smtpPort: ports.smtpPort, webPort: ports.mailWebPort });
await startStorage({ port: ports.s3Port, keys: env });
await startPaymentFake({ port: ports.paymentPort, env });
await startService("worker", process.execPath, [buildWorker()], { env });

say("Building the app…");
mustRun(bin("next"), ["build"], { env: { ...env, NODE_ENV: "production" } });

console.log(`
Cuspal is starting on http://localhost:${appPort}
  mail catcher     http://127.0.0.1:${ports.mailWebPort}
  storage fake     http://127.0.0.1:${ports.s3Port}
  payment fake     http://127.0.0.1:${ports.paymentPort} (test card 4242 4242 4242 4242; 4000 0000 0000 0002 is declined)

Demo accounts (invented people), password: cuspal-demo
  patient@cuspal.test     patient (open crown proposal)
  reception@cuspal.test   reception
  dentist@cuspal.test     dentist
  admin@cuspal.test       clinic manager

Stop the app with Ctrl-C, then \`npm run stop\` stops PostgreSQL, the mail catcher, the storage fake, the payment fake and the worker.
`);

const [appCmd, appArgs] = appServerCommand(appPort, "0.0.0.0");
const app = spawn(appCmd, appArgs, { cwd: root, env: { ...env, NODE_ENV: "production" }, stdio: "inherit" });
const forward = (sig) => () => app.kill(sig);
process.on("SIGINT", forward("SIGINT"));
process.on("SIGTERM", forward("SIGTERM"));
app.on("exit", (code) => process.exit(code ?? 0));
