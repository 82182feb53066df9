// Sign-in security against the real server (scripts/server.mjs around Next): the client's IP
// cannot be spoofed with X-Forwarded-For, a turned-off account's next request is refused, and
// staff two-factor sign-in with authenticator codes and single-use recovery codes.
import { randomUUID } from "node:crypto";
import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import bcrypt from "bcryptjs";
import { generate } from "otplib";
import { query, signIn } from "./support";

const PASSWORD = "staff-password-2468";

/** A fresh staff account (its own throttling counters), in the demo clinic unless another is named. */
async function freshStaff(role = "reception", clinicId?: string) {
  const clinic = clinicId ?? (await query<{ id: string }>("SELECT id FROM clinics WHERE slug = 'alder-bay'"))[0].id;
  const tag = randomUUID().slice(0, 8);
  const email = `e2e-${tag}@cuspal.test`;
  const name = `Test Staff ${tag}`;
  const [row] = await query<{ id: string }>(
    "INSERT INTO users (id, email, name, role, clinic_id, password_hash, active, created_at, updated_at) VALUES (gen_random_uuid(), $1, $2, $3, $4, $5, true, now(), now()) RETURNING id",
    [email, name, role, clinic, await bcrypt.hash(PASSWORD, 10)],
  );
  return { id: row.id, email, name };
}

async function postCredentials(request: APIRequestContext, fields: Record<string, string>, headers: Record<string, string> = {}) {
  const { csrfToken } = (await (await request.get("/api/auth/csrf")).json()) as { csrfToken: string };
  return request.post("/api/auth/callback/credentials", { form: { ...fields, csrfToken, json: "true" }, headers });
}

async function signOut(page: Page) {
  await page.getByRole("button", { name: "Sign out", exact: true }).click();
  await expect(page).toHaveURL(/\/$/);
}

test("a spoofed X-Forwarded-For from a direct client is neither recorded nor lets it dodge the limits", async ({ request }) => {
  const staff = await freshStaff();
  // Each attempt claims to come from somewhere else; the server only believes its socket.
  for (let i = 0; i < 6; i++) {
    await postCredentials(request, { email: staff.email, password: `wrong-${i}` }, { "X-Forwarded-For": `203.0.113.${70 + i}`, "X-Real-IP": "198.51.100.99" });
  }
  const events = await query<{ action: string; ip: string }>(
    "SELECT action, ip FROM audit_events WHERE subject_id = $1 AND action LIKE 'auth.%' ORDER BY id",
    [staff.id],
  );
  expect(events.map((e) => e.action)).toEqual([...Array(5).fill("auth.sign_in_failed"), "auth.sign_in_throttled"]);
  for (const e of events) expect(["127.0.0.1", "::1"]).toContain(e.ip);
});

test("turning a staff account off ends its open session: API 401, pages back to sign-in", async ({ page, browser }) => {
  const staff = await freshStaff("dentist");
  await signIn(page, staff.email, PASSWORD);
  await expect(page).toHaveURL(/\/clinic$/);
  expect((await page.request.get("/api/staff")).status()).toBe(200);

  const manager = await browser.newContext();
  const managerPage = await manager.newPage();
  await signIn(managerPage, "admin@cuspal.test");
  // Another role may not; the manager may; the last manager cannot turn themself off.
  expect((await page.request.patch(`/api/staff/${staff.id}`, { data: { role: "admin" } })).status()).toBe(403);
  const res = await managerPage.request.patch(`/api/staff/${staff.id}`, { data: { active: false } });
  expect(res.status()).toBe(200);
  expect(await res.json()).toEqual({ id: staff.id, role: "dentist", active: false });
  const me = (await query<{ id: string }>("SELECT id FROM users WHERE email = 'admin@cuspal.test'"))[0].id;
  const self = await managerPage.request.patch(`/api/staff/${me}`, { data: { active: false } });
  expect(self.status()).toBe(409);
  expect((await self.json()).error).toMatch(/at least one active clinic manager/);
  await manager.close();

  const refused = await page.request.get("/api/staff");
  expect(refused.status()).toBe(401);
  await page.goto("/clinic");
  await expect(page).toHaveURL(/\/sign-in/);
  // And it stays refused: the session cookie no longer opens anything.
  expect((await page.request.get("/api/auth/session")).ok()).toBe(true);
  expect(await (await page.request.get("/api/auth/session")).json()).toEqual({});
});

test("staff two-factor sign-in: enrol, then a code, then a recovery code once", async ({ page }) => {
  const staff = await freshStaff("dentist");
  await signIn(page, staff.email, PASSWORD);
  await expect(page).toHaveURL(/\/clinic$/);
  await page.getByText("Account", { exact: true }).click();
  await page.getByRole("link", { name: "Two-factor sign-in" }).click();
  await expect(page.getByRole("heading", { name: "Two-factor sign-in" })).toBeVisible();
  await expect(page.getByRole("img", { name: /QR code/ }).locator("svg")).toBeVisible();
  const secret = (await page.getByTestId("totp-secret").innerText()).replace(/\s+/g, "");
  const stored = await query<{ totp_secret: string }>("SELECT totp_secret FROM users WHERE id = $1", [staff.id]);
  expect(stored[0].totp_secret).not.toContain(secret);

  await page.getByLabel("Code from the app").fill(await generate({ secret }));
  await page.getByRole("button", { name: "Turn on two-factor sign-in" }).click();
  await expect(page.getByTestId("recovery-codes").locator("li")).toHaveCount(10);
  const codes = (await page.getByTestId("recovery-codes").locator("li").allInnerTexts()).map((c) => c.trim());
  await page.screenshot({ path: "test-results/two-factor-codes-390.png", fullPage: true });
  await page.getByRole("link", { name: /continue/ }).click();
  await expect(page).toHaveURL(/\/clinic$/);
  await signOut(page);

  // Password, then a code. The enrolment used this time step; the app's next code is accepted.
  await signIn(page, staff.email, PASSWORD);
  await expect(page.getByLabel("Sign-in code")).toBeVisible();
  await page.getByLabel("Sign-in code").fill(await generate({ secret, epoch: Math.floor(Date.now() / 1000) + 30 }));
  await page.getByRole("button", { name: "Confirm code" }).click();
  await expect(page).toHaveURL(/\/clinic$/);
  await signOut(page);

  // A recovery code works once.
  for (const expected of ["signed in", "refused"]) {
    await signIn(page, staff.email, PASSWORD);
    await page.getByLabel("Sign-in code").fill(codes[0]);
    await page.getByRole("button", { name: "Confirm code" }).click();
    if (expected === "signed in") {
      await expect(page).toHaveURL(/\/clinic$/);
      await signOut(page);
    } else {
      await expect(page.getByTestId("sign-in-error")).toContainText("That code did not work");
      await expect(page).toHaveURL(/\/sign-in/);
    }
  }
  const methods = await query<{ method: string }>(
    "SELECT data->>'method' AS method FROM audit_events WHERE subject_id = $1 AND action = 'auth.sign_in' ORDER BY id",
    [staff.id],
  );
  expect(methods.map((m) => m.method)).toEqual(["password", "password+code", "password+recovery_code"]);
});

test("a clinic that requires two-factor sends its staff to enrolment first", async ({ page }) => {
  const tag = randomUUID().slice(0, 8);
  const [clinic] = await query<{ id: string; require_two_factor: boolean }>(
    "INSERT INTO clinics (id, name, slug, time_zone, address, created_at, updated_at) VALUES (gen_random_uuid(), $1, $2, 'America/Toronto', '2 Test Lane', now(), now()) RETURNING id, require_two_factor",
    [`New clinic ${tag}`, `new-${tag}`],
  );
  expect(clinic.require_two_factor).toBe(true); // on by default for a new clinic
  const staff = await freshStaff("reception", clinic.id);
  await signIn(page, staff.email, PASSWORD);
  await expect(page).toHaveURL(/\/two-factor$/);
  await expect(page.getByText("Your clinic asks staff to sign in with a code")).toBeVisible();
  await page.goto("/clinic");
  await expect(page).toHaveURL(/\/two-factor$/);
  const api = await page.request.get("/api/staff");
  expect(api.status()).toBe(403);
  expect((await api.json()).error).toMatch(/two-factor/);
});

test("sign out on all devices, and the clinic manager ending a staff member's sessions", async ({ browser }) => {
  const staff = await freshStaff("reception");
  const desk = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const phone = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const [deskPage, phonePage] = [await desk.newPage(), await phone.newPage()];
  await signIn(deskPage, staff.email, PASSWORD);
  await signIn(phonePage, staff.email, PASSWORD);
  await expect(deskPage).toHaveURL(/\/clinic$/);
  await expect(phonePage).toHaveURL(/\/clinic$/);
  await phonePage.getByText("Account", { exact: true }).click();
  await phonePage.screenshot({ path: "test-results/account-menu-390.png" });
  await phonePage.getByRole("button", { name: "Sign out on all devices" }).click();
  await expect(phonePage).toHaveURL(/\/sign-in/);
  expect((await deskPage.request.get("/api/staff")).status()).toBe(401);

  // Signed in again on the desk; the manager ends that session from the staff page.
  await signIn(deskPage, staff.email, PASSWORD);
  await expect(deskPage).toHaveURL(/\/clinic$/);
  const manager = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const managerPage = await manager.newPage();
  await signIn(managerPage, "admin@cuspal.test");
  await managerPage.goto("/clinic/settings/staff");
  await managerPage.getByRole("button", { name: `End sessions of ${staff.name}` }).click();
  await expect(managerPage.getByText("Their open sessions have ended")).toBeVisible();
  await managerPage.screenshot({ path: "test-results/staff-settings-1280.png", fullPage: true });
  expect((await deskPage.request.get("/api/staff")).status()).toBe(401);
  const ended = await query<{ n: string }>("SELECT count(*) AS n FROM audit_events WHERE subject_id = $1 AND action = 'settings.staff_sessions_ended'", [staff.id]);
  expect(Number(ended[0].n)).toBe(1);
  await Promise.all([desk.close(), phone.close(), manager.close()]);
});
