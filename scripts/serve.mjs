// `npm run serve`: one more app instance against services that already run (PostgreSQL, object
// storage, SMTP), for example a second instance beside `npm run demo`. It neither builds nor
// migrates nor seeds: run `npm run build` (or the demo) first. PORT chooses the port (default 3001).
// Every setting comes from the environment when set, else from the same local secrets in .data as
// the demo, so a session signed in on one instance is valid on the other.
// `npm run serve -- --worker` also starts a mail worker beside it (compiled to plain JavaScript
// first with esbuild, in under a second, as the demo does: no transpiler at run time).
import { spawn } from "node:child_process";
import { existsSync } from "node:fs";
import path from "node:path";
import { appEnv, appServerCommand, buildWorker, fail, root, say } from "./lib.mjs";

const appPort = Number(process.env.PORT ?? 3001);
if (!Number.isInteger(appPort) || appPort <= 0 || appPort > 65535) fail(`PORT must be a port number, not ${process.env.PORT}.`);
const withWorker = process.argv.slice(2).includes("--worker");

const env = {
  ...process.env,
  ...appEnv({ db: "cuspal", appPort, smtpPort: 1025, mailWebPort: 1080, s3Port: 4569, paymentPort: 12111 }),
  NODE_ENV: "production",
};
const distDir = process.env.NEXT_DIST_DIR || ".next";
if (!existsSync(path.join(root, distDir, "BUILD_ID"))) {
  fail(`No build in ${distDir}: run \`npm run build\` (or \`npm run demo\` once) before \`npm run serve\`.`);
}

const children = [];
const [cmd, args] = appServerCommand(appPort, process.env.HOST ?? "0.0.0.0");
children.push(spawn(cmd, args, { cwd: root, env, stdio: "inherit" }));
if (withWorker) children.push(spawn(process.execPath, [buildWorker()], { cwd: root, env, stdio: "inherit" }));
say(`Serving Cuspal on port ${appPort}${withWorker ? " with a mail worker" : ""} (database ${new URL(env.DATABASE_URL).host}${new URL(env.DATABASE_URL).pathname}).`);

const forward = (sig) => () => children.forEach((c) => c.kill(sig));
process.on("SIGINT", forward("SIGINT"));
process.on("SIGTERM", forward("SIGTERM"));
// When one child ends, end the others and leave with its code.
for (const c of children) {
  c.on("exit", (code) => {
    children.forEach((o) => o !== c && o.kill("SIGTERM"));
    process.exit(code ?? 0);
  });
}
