// `npm test`: the same set-up as the demo on the test database and test ports, then every
// runner (Vitest: unit + integration; Playwright: browser), ending with one totals line.
// `npm test -- unit [vitest args]` or `npm test -- e2e [playwright args]` runs one runner.
import { existsSync, readFileSync, rmSync, mkdirSync } from "node:fs";
import path from "node:path";
import {
  appEnv, bin, buildWorker, dataDir, ensureChromium, ensureDatabases, ensureDependencies, ensurePostgres, ensureSealValidators, mustRun,
  run, say, startMailCatcher, startPaymentFake, startService, startStorage, stopPostgres, stopService,
} from "./lib.mjs";

const [only, ...extra] = process.argv.slice(2);
const wantUnit = !only || only === "unit";
const wantE2e = !only || only === "e2e";

// CUSPAL_TEST_PORT_OFFSET moves every test port, so two checkouts can run their tests at once
// (give each its own CUSPAL_PG_PORT too).
const offset = Number(process.env.CUSPAL_TEST_PORT_OFFSET ?? 0);
const ports = { db: "cuspal_test", appPort: 3100 + offset, smtpPort: 1125 + offset, mailWebPort: 1180 + offset, s3Port: 4579 + offset, paymentPort: 12211 + offset };
ensureDependencies();
if (wantE2e) ensureChromium();
if (wantUnit) ensureSealValidators();
const startedPg = await ensurePostgres();
await ensureDatabases(["cuspal_test", "cuspal_test_migrations"], { fresh: ["cuspal_test", "cuspal_test_migrations"] });

const env = {
  ...process.env,
  ...appEnv(ports),
  MIGRATIONS_DATABASE_URL: process.env.MIGRATIONS_DATABASE_URL ?? appEnv(ports).OWNER_DATABASE_URL.replace(/\/cuspal_test$/, "/cuspal_test_migrations"),
  NEXT_DIST_DIR: ".next-test",
  CUSPAL_TEST: "1",
};
const reportDir = path.join(dataDir, "reports");
rmSync(reportDir, { recursive: true, force: true });
mkdirSync(reportDir, { recursive: true });

say("Migrating the test database…");
mustRun(bin("tsx"), ["db/migrate.ts", "up"], { env });
mustRun(bin("tsx"), ["scripts/make-seal-certificate.ts"], { env }, "Creating the clinic seal certificate");
await startMailCatcher({ smtpPort: ports.smtpPort, webPort: ports.mailWebPort, name: "test-mail-catcher" });
await startStorage({ port: ports.s3Port, name: "test-storage", keys: env });
await startPaymentFake({ port: ports.paymentPort, env, name: "test-payment-fake" });

const totals = { passed: 0, failed: 0, skipped: 0 };
let broken = false;

try {
  if (wantUnit) {
    say("Vitest: unit and integration tests…");
    const json = path.join(reportDir, "vitest.json");
    const status = run(bin("vitest"), ["run", "--reporter=default", "--reporter=json", `--outputFile=${json}`, ...(only ? extra : [])], { env });
    if (existsSync(json)) {
      const r = JSON.parse(readFileSync(json, "utf8"));
      totals.passed += r.numPassedTests;
      totals.failed += r.numFailedTests;
      totals.skipped += r.numPendingTests + r.numTodoTests;
      if (status !== 0 && r.numFailedTests === 0) {
        totals.failed += 1;
        broken = true;
      }
    } else if (status !== 0) {
      totals.failed += 1;
      broken = true;
    }
  }

  if (wantE2e) {
    say("Loading the demo clinic into the test database…");
    if (run(bin("tsx"), ["db/seed.ts", "--reset"], { env }) !== 0) throw new Error("Loading the demo clinic failed.");
    // The worker sends the e-mail the browser tests cause (confirmations, reminders), as in the demo.
    await startService("test-worker", process.execPath, [buildWorker()], { env });
    say("Building the app for the browser tests…");
    if (run(bin("next"), ["build"], { env: { ...env, NODE_ENV: "production" } }) !== 0) {
      throw new Error("next build failed; see its output above.");
    }
    say("Playwright: browser tests…");
    const json = path.join(reportDir, "playwright.json");
    const status = run(bin("playwright"), ["test", ...(only ? extra : [])], {
      env: { ...env, PLAYWRIGHT_JSON_OUTPUT_NAME: json },
    });
    if (existsSync(json)) {
      const s = JSON.parse(readFileSync(json, "utf8")).stats;
      totals.passed += s.expected + (s.flaky ?? 0);
      totals.failed += s.unexpected;
      totals.skipped += s.skipped;
      if (status !== 0 && s.unexpected === 0) {
        totals.failed += 1;
        broken = true;
      }
    } else if (status !== 0) {
      totals.failed += 1;
      broken = true;
    }
  }
} catch (err) {
  console.error(err instanceof Error ? err.message : err);
  totals.failed += 1;
  broken = true;
} finally {
  stopService("test-worker");
  stopService("test-mail-catcher");
  stopService("test-storage");
  stopService("test-payment-fake");
  if (startedPg) stopPostgres();
}

if (broken) console.log("A runner failed outside its tests; see its output above.");
console.log(`${totals.passed} passed, ${totals.failed} failed, ${totals.skipped} skipped`);
process.exit(totals.failed > 0 ? 1 : 0);
