// `npm run lighthouse`: Lighthouse 12 (mobile) on the start page, the sign-in page, the patient's
// home and a proposal, signed in as the demo patient; prints each figure beside its budget in
// tests/bench/lighthouse-budgets.json. Uses its own database (cuspal_lighthouse, migrated and
// seeded with the demo clinic) and its own build in .next-lighthouse (built once; set
// LIGHTHOUSE_REBUILD=1 to build again). Needs Chromium at /usr/bin/chromium. Below the table it
// splits each page's script into the framework's chunks and the app's own; LIGHTHOUSE_REPORTS=<dir>
// keeps each page's full Lighthouse report there (LCP element, network requests).
import { spawn } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import net from "node:net";
import path from "node:path";
import {
  appEnv, appServerCommand, bin, ensureChromium, ensureDatabases, ensureDependencies, ensurePostgres, fail, mustRun, root, say,
} from "./lib.mjs";

const CHROME_FLAGS = [
  "--headless", "--no-sandbox", "--disable-gpu",
  "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run",
];
const budgets = JSON.parse(readFileSync(path.join(root, "tests/bench/lighthouse-budgets.json"), "utf8"));

function freePort() {
  return new Promise((resolve) => {
    const s = net.createServer();
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address();
      s.close(() => resolve(port));
    });
  });
}

ensureDependencies();
ensureChromium();
await ensurePostgres();
await ensureDatabases(["cuspal_lighthouse"]);
const appPort = Number(process.env.PORT ?? (await freePort()));
const env = {
  ...process.env,
  ...appEnv({ db: "cuspal_lighthouse", appPort, smtpPort: await freePort(), mailWebPort: await freePort(), s3Port: await freePort(), paymentPort: await freePort() }),
  NEXT_DIST_DIR: process.env.NEXT_DIST_DIR ?? ".next-lighthouse",
  CHROME_PATH: process.env.CHROME_PATH ?? "/usr/bin/chromium",
};
mustRun(bin("tsx"), ["db/migrate.ts", "up"], { env });
mustRun(bin("tsx"), ["scripts/make-seal-certificate.ts"], { env }, "Creating the clinic seal certificate");
mustRun(bin("tsx"), ["db/seed.ts", "--reset"], { env }, "Loading the demo clinic");
if (!existsSync(path.join(root, env.NEXT_DIST_DIR, "BUILD_ID")) || process.env.LIGHTHOUSE_REBUILD === "1") {
  say(`Building the app into ${env.NEXT_DIST_DIR}…`);
  mustRun(bin("next"), ["build"], { env: { ...env, NODE_ENV: "production" } });
}

const [cmd, args] = appServerCommand(appPort);
const app = spawn(cmd, args, { cwd: root, env: { ...env, NODE_ENV: "production" }, stdio: ["ignore", "ignore", "pipe"], detached: true });
let appErrors = "";
app.stderr.on("data", (d) => { appErrors = (appErrors + d).slice(-4000); });
const base = `http://localhost:${appPort}`;
const stopApp = () => { try { process.kill(-app.pid, "SIGTERM"); } catch { /* gone */ } };
process.on("exit", stopApp);
let up = false;
for (let i = 0; i < 300 && !up; i++) {
  up = await fetch(`${base}/api/health`).then((r) => r.ok, () => false);
  if (!up) await new Promise((r) => setTimeout(r, 200));
}
if (!up) fail(`The app did not start for Lighthouse.\n${appErrors}`);

// Sign in as the demo patient in a browser, as a person would, and keep the session cookie.
const { chromium } = await import("@playwright/test");
const browser = await chromium.launch({ executablePath: env.CHROME_PATH, args: CHROME_FLAGS.filter((f) => f !== "--headless") });
const page = await browser.newPage();
await page.goto(`${base}/sign-in`);
await page.getByLabel("E-mail", { exact: true }).fill("patient@cuspal.test");
await page.getByLabel("Password").fill("cuspal-demo");
await page.getByRole("button", { name: "Sign in", exact: true }).click();
await page.waitForURL(/\/patient(\/|$)/);
const session = (await page.context().cookies()).find((c) => c.name.endsWith("next-auth.session-token"));
if (!session) fail("Signing in as the demo patient set no session cookie.");
const { proposals } = await (await page.request.get(`${base}/api/proposals`)).json();
await browser.close();
if (!proposals?.length) fail("The demo patient has no proposal to measure.");
const cookie = `${session.name}=${session.value}`;

const pages = [
  { name: "/", url: `${base}/`, signedIn: false },
  { name: "/sign-in", url: `${base}/sign-in`, signedIn: false },
  { name: "/patient", url: `${base}/patient`, signedIn: true },
  // A proposal still open to booking (one with a visit redirects to that visit).
  { name: "proposal", url: `${base}/patient/proposals/${(proposals.find((p) => p.status === "open" && !p.activeVisit) ?? proposals[0]).id}`, signedIn: true },
];

// A signed-in page must answer as the patient, not send Lighthouse to the sign-in page.
for (const p of pages.filter((x) => x.signedIn)) {
  const res = await fetch(p.url, { headers: { cookie } });
  if (res.status !== 200 || new URL(res.url).pathname.startsWith("/sign-in")) fail(`${p.name} answered ${res.status} at ${res.url} with the patient's session.`);
}

// The chunks every App Router page loads whatever the app does (React, React DOM, Next's router
// runtime): the build manifest's `rootMainFiles`. Their transfer is the floor of any page's script.
const manifest = JSON.parse(readFileSync(path.join(root, env.NEXT_DIST_DIR, "build-manifest.json"), "utf8"));
const frameworkChunks = new Set((manifest.rootMainFiles ?? []).map((f) => `/_next/${f}`));

const { default: lighthouse } = await import("lighthouse");
const chromeLauncher = await import("chrome-launcher");
const rows = [];
let over = false;
for (const p of pages) {
  const chrome = await chromeLauncher.launch({ chromePath: env.CHROME_PATH, chromeFlags: CHROME_FLAGS });
  try {
    const result = await lighthouse(p.url, {
      port: chrome.port, output: "json", logLevel: "error", onlyCategories: ["performance"],
      extraHeaders: p.signedIn ? { Cookie: cookie } : undefined,
    });
    const lhr = result.lhr;
    // The full report of each page, for finding what holds the LCP or what a page ships.
    if (process.env.LIGHTHOUSE_REPORTS) {
      mkdirSync(process.env.LIGHTHOUSE_REPORTS, { recursive: true });
      writeFileSync(path.join(process.env.LIGHTHOUSE_REPORTS, `${p.name.replace(/\W+/g, "_") || "root"}.json`), JSON.stringify(lhr));
    }
    const script = lhr.audits["resource-summary"].details.items.find((i) => i.resourceType === "script");
    const figures = {
      performance: Math.round((lhr.categories.performance.score ?? 0) * 100),
      lcp: lhr.audits["largest-contentful-paint"].numericValue,
      cls: lhr.audits["cumulative-layout-shift"].numericValue,
      tbt: lhr.audits["total-blocking-time"].numericValue,
      scriptKb: (script?.transferSize ?? 0) / 1024,
    };
    if (lhr.finalDisplayedUrl && !lhr.finalDisplayedUrl.startsWith(p.url)) {
      console.log(`  note: ${p.name} ended on ${lhr.finalDisplayedUrl}`);
    }
    // Split the script bytes: the framework's own chunks (the same on every page) and the app's.
    const scripts = lhr.audits["network-requests"].details.items.filter((i) => i.resourceType === "Script");
    const isFramework = (url) => frameworkChunks.has(new URL(url).pathname);
    const sum = (items) => items.reduce((n, i) => n + (i.transferSize ?? 0), 0) / 1024;
    const split = { framework: sum(scripts.filter((i) => isFramework(i.url))), app: sum(scripts.filter((i) => !isFramework(i.url))) };
    rows.push({ page: p.name, figures, split });
  } finally {
    await chrome.kill();
  }
}
stopApp();

const fmt = {
  performance: (v) => String(v),
  lcp: (v) => `${(v / 1000).toFixed(2)} s`,
  cls: (v) => v.toFixed(3),
  tbt: (v) => `${Math.round(v)} ms`,
  scriptKb: (v) => `${v.toFixed(1)} kB`,
};
const budgetText = {
  performance: `≥ ${budgets.performance.min}`, lcp: `≤ ${budgets.lcp.max / 1000} s`, cls: `≤ ${budgets.cls.max}`,
  tbt: `≤ ${budgets.tbt.max} ms`, scriptKb: `≤ ${budgets.scriptKb.max} kB`,
};
const within = (k, v) => (budgets[k].min !== undefined ? v >= budgets[k].min : v <= budgets[k].max);
console.log(`\nLighthouse 12, mobile (simulated throttling), ${base}`);
console.log(["page".padEnd(10), ...Object.keys(fmt).map((k) => `${k} (${budgetText[k]})`.padEnd(26))].join(" | "));
for (const r of rows) {
  const cells = Object.keys(fmt).map((k) => {
    const ok = within(k, r.figures[k]);
    if (!ok) over = true;
    return `${fmt[k](r.figures[k])}${ok ? "" : "  over"}`.padEnd(26);
  });
  console.log([r.page.padEnd(10), ...cells].join(" | "));
}
console.log(`\nScript transferred, split: the framework's chunks (build-manifest.json rootMainFiles: ${frameworkChunks.size} files,`);
console.log("the same on every App Router page) and this app's own chunks (its client components and their libraries).");
console.log(["page".padEnd(10), "framework".padEnd(12), "app".padEnd(12), "total"].join(" | "));
for (const r of rows) {
  console.log([r.page.padEnd(10), `${r.split.framework.toFixed(1)} kB`.padEnd(12), `${r.split.app.toFixed(1)} kB`.padEnd(12), `${(r.split.framework + r.split.app).toFixed(1)} kB`].join(" | "));
}
const floor = Math.min(...rows.map((r) => r.split.framework));
if (floor > budgets.scriptKb.max) {
  console.log(`The framework alone transfers ${floor.toFixed(1)} kB, over the ${budgets.scriptKb.max} kB script budget before any app code: no page can meet it with this Next.js and React.`);
}
process.exit(over ? 1 : 0);
