// Sign-in, the sign-in link and sign-out are plain HTML forms posted to next-auth: they work with
// JavaScript turned off, and the light pages carry no message catalogue to the browser.
import { expect, test } from "@playwright/test";
import { DEMO_PASSWORD } from "./support";

test.describe("without JavaScript", () => {
  test.use({ javaScriptEnabled: false });

  test("a patient signs in with a plain form post, a wrong password gets its message, and signing out works", async ({ page }) => {
    await page.goto("/sign-in");
    await page.getByLabel("E-mail", { exact: true }).fill("patient@cuspal.test");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await expect(page).toHaveURL(/\/sign-in\?/);
    await expect(page.getByTestId("sign-in-error")).toHaveText("That e-mail and password do not match an account. Check both and try again.");

    await page.getByLabel("E-mail", { exact: true }).fill("patient@cuspal.test");
    await page.getByLabel("Password").fill(DEMO_PASSWORD);
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await expect(page).toHaveURL(/\/patient$/);
    await expect(page.getByTestId("signed-in-name")).toHaveText("Zoë Halvorsen-Ruiz");

    await page.getByRole("button", { name: "Sign out", exact: true }).click();
    await expect(page).toHaveURL(/\/$/);
    await page.goto("/patient");
    await expect(page).toHaveURL(/\/sign-in/);
  });

  test("asking for a sign-in link is a plain form post too", async ({ page }) => {
    await page.goto("/sign-in");
    await page.getByLabel("Your e-mail").fill("patient@cuspal.test");
    await page.getByRole("button", { name: "E-mail me a sign-in link" }).click();
    await expect(page).toHaveURL(/\/sign-in\/check-mail/);
  });
});

test("the start, sign-in and patient pages send no message catalogue to the browser", async ({ page }) => {
  // A message only client components would read (the slot picker's); a page that ships the
  // catalogue carries it in its inline data.
  const marker = "Looking for free times";
  for (const path of ["/", "/sign-in"]) {
    const html = await (await page.request.get(path)).text();
    expect(html, path).not.toContain(marker);
  }
  await page.goto("/sign-in");
  await page.getByLabel("E-mail", { exact: true }).fill("patient@cuspal.test");
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
  await page.waitForURL(/\/patient$/);
  expect(await (await page.request.get("/patient")).text()).not.toContain(marker);
});
