import { expect, test } from "@playwright/test";
import { expectNoAxeViolations, signIn } from "./support";

const ACCOUNTS = [
  { email: "patient@cuspal.test", home: "/patient", name: "Zoë Halvorsen-Ruiz", role: "Patient" },
  { email: "reception@cuspal.test", home: "/clinic", name: "Oskar Feldmann-Price", role: "Reception" },
  { email: "dentist@cuspal.test", home: "/clinic", name: "Dr Amara Quist", role: "Dentist" },
  { email: "admin@cuspal.test", home: "/clinic", name: "Lena Brightwater", role: "Clinic manager" },
];

test("the landing page says what Cuspal does and passes axe-core", async ({ page }) => {
  await page.goto("/");
  await expect(page.getByRole("heading", { level: 1 })).toContainText("one visit");
  await expect(page.getByTestId("cautions-note")).toContainText("licensed practice prevail");
  await expectNoAxeViolations(page);
});

test("the sign-in page passes axe-core", async ({ page }) => {
  await page.goto("/sign-in");
  await expectNoAxeViolations(page);
});

for (const account of ACCOUNTS) {
  test(`${account.role} signs in, lands on their home, and signs out`, async ({ page }) => {
    await signIn(page, account.email);
    await expect(page).toHaveURL(new RegExp(`${account.home}$`));
    await expect(page.getByTestId("signed-in-name")).toHaveText(account.name);
    await expectNoAxeViolations(page);
    await page.getByRole("button", { name: "Sign out" }).click();
    await expect(page).toHaveURL(/\/$/);
    await page.goto(account.home);
    await expect(page).toHaveURL(/\/sign-in/);
  });
}

test("a wrong password gets one clear message that does not say which field was wrong", async ({ page }) => {
  await signIn(page, "reception@cuspal.test", "not-the-password");
  await expect(page.getByTestId("sign-in-error")).toHaveText("That e-mail and password do not match an account. Check both and try again.");
  await signIn(page, "nobody@cuspal.test", "not-the-password");
  await expect(page.getByTestId("sign-in-error")).toHaveText("That e-mail and password do not match an account. Check both and try again.");
  await expect(page).toHaveURL(/\/sign-in/);
});

test("a patient gets no clinic page and no clinic API", async ({ page }) => {
  await signIn(page, "patient@cuspal.test");
  await expect(page).toHaveURL(/\/patient$/);
  await page.goto("/clinic");
  await expect(page).toHaveURL(/\/patient$/);
  const res = await page.request.get("/api/staff");
  expect(res.status()).toBe(403);
  expect((await res.json()).error).toMatch(/role/);
});

test("the clinic API refuses anonymous callers with JSON", async ({ request }) => {
  const res = await request.get("/api/staff");
  expect(res.status()).toBe(401);
  expect(await res.json()).toEqual({ error: "Please sign in first." });
});

test("health endpoint reports the database", async ({ request }) => {
  const res = await request.get("/api/health");
  expect(res.status()).toBe(200);
  expect(await res.json()).toEqual({ ok: true, db: "up" });
});
