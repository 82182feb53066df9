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

test("a patient signs in with an e-mailed link from the mail catcher", async ({ page }) => {
  const catcher = process.env.MAIL_CATCHER_URL;
  expect(catcher, "MAIL_CATCHER_URL is set by npm test").toBeTruthy();
  const since = Date.now();
  await page.goto("/sign-in");
  await page.getByLabel("Your e-mail").fill("patient@cuspal.test");
  await page.getByRole("button", { name: "E-mail me a sign-in link" }).click();
  await expect(page).toHaveURL(/\/sign-in\/check-mail/);

  let link: string | undefined;
  for (let i = 0; i < 40 && !link; i++) {
    const mails = (await (await page.request.get(`${catcher}/api/email`)).json()) as { subject: string; time: string; to: { address: string }[]; text?: string; html?: string }[];
    const mail = mails.reverse().find((m) => m.subject === "Your Cuspal sign-in link" && m.to.some((t) => t.address === "patient@cuspal.test") && new Date(m.time).getTime() >= since - 2000);
    link = mail?.text?.match(/https?:\/\/\S+\/api\/auth\/callback\/email\S+/)?.[0];
    if (!link) await page.waitForTimeout(250);
  }
  expect(link).toBeTruthy();
  await page.goto(link!.replace(/[)\]>]+$/, ""));
  await expect(page).toHaveURL(/\/patient$/);
  await expect(page.getByTestId("signed-in-name")).toHaveText("Zoë Halvorsen-Ruiz");
});

test("asking for a link for a staff or unknown address shows the same page and sends nothing", async ({ page }) => {
  const catcher = process.env.MAIL_CATCHER_URL!;
  const before = ((await (await page.request.get(`${catcher}/api/email`)).json()) as { to: { address: string }[] }[]).length;
  for (const email of ["reception@cuspal.test", "nobody-here@cuspal.test"]) {
    await page.goto("/sign-in");
    await page.getByLabel("Your e-mail").fill(email);
    await page.getByRole("button", { name: "E-mail me a sign-in link" }).click();
    await expect(page).toHaveURL(/\/sign-in\/check-mail/);
  }
  await page.waitForTimeout(500);
  const mails = (await (await page.request.get(`${catcher}/api/email`)).json()) as { to: { address: string }[] }[];
  expect(mails.slice(before).filter((m) => m.to.some((t) => ["reception@cuspal.test", "nobody-here@cuspal.test"].includes(t.address)))).toEqual([]);
});
