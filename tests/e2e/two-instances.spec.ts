// Two app instances and two mail workers on one PostgreSQL and one object store behave as one:
// a session from one instance works on the other, a booking race split over both has one winner,
// a document uploaded through one downloads through the other, and 1,000 reminders drained by two
// workers arrive once each. The second instance and worker come from `npm run serve -- --worker`
// on PORT + 1, with the same environment.
import { spawn, type ChildProcess } from "node:child_process";
import { expect, test } from "@playwright/test";
import { pdfDocument } from "../support/sample-files";
import { query, signIn } from "./support";

const portA = Number(process.env.PORT ?? 3100);
const portB = portA + 1;
const A = `http://localhost:${portA}`;
const B = `http://localhost:${portB}`;
const REMINDERS = 1000;

// Playwright runs from the repository root.
const root = process.cwd();

let serveB: ChildProcess | undefined;
let logB = "";

function stop(child: ChildProcess | undefined) {
  if (child?.pid && child.exitCode === null) {
    try { process.kill(-child.pid, "SIGTERM"); } catch { /* already gone */ }
  }
}

test.describe.configure({ mode: "serial" });

test.beforeAll(async () => {
  test.setTimeout(90_000);
  serveB = spawn(process.execPath, ["scripts/serve.mjs", "--worker"], {
    cwd: root, env: { ...process.env, PORT: String(portB), HOST: "127.0.0.1", WORKER_POLL_MS: "200" }, stdio: ["ignore", "pipe", "pipe"], detached: true,
  });
  serveB.stdout!.on("data", (d: Buffer) => (logB += d.toString()));
  serveB.stderr!.on("data", (d: Buffer) => (logB += d.toString()));
  for (let i = 0; i < 300; i++) {
    if (await fetch(`${B}/api/health`).then((r) => r.ok, () => false)) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`The second instance did not answer on port ${portB}:\n${logB}`);
});

test.afterAll(() => stop(serveB));

test("a session signed in on one instance works on the other", async ({ page }) => {
  await signIn(page, "patient@cuspal.test");
  // Cookies are not kept apart by port, so the same browser session reaches instance B.
  const onB = await page.request.get(`${B}/api/proposals`);
  expect(onB.status()).toBe(200);
  const { proposals } = await onB.json();
  expect(proposals.length).toBeGreaterThanOrEqual(1);
  await page.goto(`${B}/patient`);
  await expect(page).toHaveURL(`${B}/patient`);
  // Without the cookie, instance B turns the same request away.
  expect((await fetch(`${B}/api/proposals`)).status).toBe(401);
});

test("a document uploaded through one instance downloads through the other", async ({ page }) => {
  await signIn(page, "patient@cuspal.test");
  const bytes = pdfDocument("Two-instance check");
  const title = `Two-instance check ${Date.now()}`;
  const up = await page.request.post(`${A}/api/documents`, {
    multipart: { kind: "referral_letter", title, file: { name: "check.pdf", mimeType: "application/pdf", buffer: Buffer.from(bytes) } },
  });
  expect(up.status(), await up.text()).toBe(201);
  const { id } = await up.json();
  const down = await page.request.get(`${B}/api/documents/${id}`);
  expect(down.status()).toBe(200);
  expect(Buffer.compare(await down.body(), Buffer.from(bytes))).toBe(0);
});

test("a booking race split over both instances has one winner", async ({ page }) => {
  await signIn(page, "patient@cuspal.test");
  const { proposals } = await (await page.request.get(`${A}/api/proposals`)).json();
  const p = proposals.find((x: { status: string; materials: unknown[]; activeVisit: unknown }) => x.status === "open" && x.materials.length && !x.activeVisit);
  expect(p, "an open proposal without a visit").toBeTruthy();
  const m = p.materials[0];
  const avail = await (await page.request.get(`${B}/api/proposals/${p.id}/availability?materialId=${m.id}&mode=${m.modes[0]}&days=14`)).json();
  expect(avail.slots.length).toBeGreaterThan(0);
  const body = { proposalId: p.id, materialId: m.id, mode: m.modes[0], start: avail.slots[0].start };
  const statuses = await Promise.all(
    Array.from({ length: 10 }, (_, i) => page.request.post(`${i % 2 ? B : A}/api/appointments`, { data: body }).then((r) => r.status())),
  );
  expect(statuses.filter((s) => s === 201)).toHaveLength(1);
  expect(statuses.filter((s) => s === 409)).toHaveLength(9);
});

test("1,000 reminders drained by two workers arrive once each", async ({ request }) => {
  test.setTimeout(240_000);
  const tag = `r${Date.now()}`;
  // Visits three days ahead for 1,000 invented patients of the demo clinic, each with a reminder due now.
  const [{ n }] = await query<{ n: string }>(
    `WITH clinic AS (SELECT c.id FROM clinics c ORDER BY c.created_at LIMIT 1),
     eq AS (SELECT (SELECT id FROM equipment WHERE clinic_id = clinic.id AND kind = 'chair' LIMIT 1) AS chair,
                   (SELECT id FROM equipment WHERE clinic_id = clinic.id AND kind = 'mill' LIMIT 1) AS mill,
                   (SELECT id FROM users WHERE clinic_id = clinic.id AND role = 'dentist' LIMIT 1) AS dentist,
                   (SELECT id FROM materials WHERE clinic_id = clinic.id ORDER BY key LIMIT 1) AS material, clinic.id AS clinic FROM clinic),
     u AS (INSERT INTO users (email, name, role, clinic_id)
           SELECT '${tag}-' || i || '@cuspal.test', 'Reminder patient ' || i, 'patient', eq.clinic FROM eq, generate_series(1, ${REMINDERS}) i RETURNING id, clinic_id),
     p AS (INSERT INTO patients (user_id, clinic_id) SELECT id, clinic_id FROM u RETURNING id, clinic_id),
     pr AS (INSERT INTO proposals (clinic_id, patient_id, dentist_id, tooth, fee_cents)
            SELECT p.clinic_id, p.id, eq.dentist, 36, 100000 FROM p, eq RETURNING id, patient_id, clinic_id),
     a AS (INSERT INTO appointments (clinic_id, proposal_id, patient_id, dentist_id, material_id, mode, tooth, status, starts_at, ends_at, chair_id, mill_id, fee_cents)
           SELECT pr.clinic_id, pr.id, pr.patient_id, eq.dentist, eq.material, 'standard', 36, 'confirmed',
                  date_trunc('hour', now()) + interval '72 hours', date_trunc('hour', now()) + interval '74 hours', eq.chair, eq.mill, 100000
             FROM pr, eq RETURNING id, clinic_id, starts_at)
     , o AS (INSERT INTO mail_outbox (clinic_id, appointment_id, kind, hours_before, visit_starts_at, idempotency_key, due_at)
             SELECT clinic_id, id, 'reminder', 48, starts_at, '${tag}:' || id, now() FROM a RETURNING 1)
     SELECT count(*) AS n FROM o`,
  );
  expect(Number(n)).toBe(REMINDERS);

  const catcher = process.env.MAIL_CATCHER_URL!;
  type Caught = { id: string; to: { address: string }[]; subject: string };
  let mine: Caught[] = [];
  for (let i = 0; i < 200; i++) {
    const all = (await (await request.get(`${catcher}/api/email`)).json()) as Caught[];
    mine = all.filter((m) => m.to.some((t) => t.address.startsWith(`${tag}-`)));
    if (mine.length >= REMINDERS) break;
    await new Promise((r) => setTimeout(r, 1000));
  }
  await new Promise((r) => setTimeout(r, 2000)); // a late duplicate would show up here
  const all = (await (await request.get(`${catcher}/api/email`)).json()) as Caught[];
  mine = all.filter((m) => m.to.some((t) => t.address.startsWith(`${tag}-`)));
  const recipients = new Set(mine.map((m) => m.to[0].address));
  expect(recipients.size, "every reminder arrived").toBe(REMINDERS);
  expect(mine.length, "no reminder arrived twice").toBe(REMINDERS);
  // Both workers took part: the second one reports what it sent.
  const sentByB = [...logB.matchAll(/sent (\d+)/g)].reduce((sum, m) => sum + Number(m[1]), 0);
  console.log(`reminders sent by the second worker: ${sentByB} of ${REMINDERS}`);
  expect(sentByB).toBeGreaterThan(0);
  expect(sentByB).toBeLessThan(REMINDERS);
});
