// Shared steps for browser tests: signing in as a demo account, checking accessibility, signing.
import AxeBuilder from "@axe-core/playwright";
import { expect, type Page } from "@playwright/test";
import pg from "pg";

export const DEMO_PASSWORD = "cuspal-demo";

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail", { exact: true }).fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
  // With the right password, wait until the portal has loaded so the session cookie is set.
  if (password === DEMO_PASSWORD) await page.waitForURL(/\/(patient|clinic)(\/|$)/);
}

/** axe-core over the page with the WCAG 2.x A/AA rules; no violations allowed. */
export async function expectNoAxeViolations(page: Page) {
  const results = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa"]).analyze();
  const summary = results.violations.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
  expect(summary, "axe-core violations").toEqual([]);
}

/** One query against the test database, to check what the screens wrote. */
export async function query<T>(sql: string, params: unknown[] = []): Promise<T[]> {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    return (await client.query(sql, params)).rows as T[];
  } finally {
    await client.end();
  }
}

/** Draws a signature-like wave across the consent's signature canvas with the mouse (pointer events, as a finger would). */
export async function drawSignature(page: Page) {
  const box = (await page.getByTestId("signature-canvas").boundingBox())!;
  const y0 = box.y + box.height * 0.55;
  await page.mouse.move(box.x + box.width * 0.1, y0);
  await page.mouse.down();
  for (let i = 1; i <= 40; i++) {
    const x = box.x + box.width * (0.1 + (0.8 * i) / 40);
    const y = y0 + Math.sin(i / 3) * box.height * 0.3;
    await page.mouse.move(x, y, { steps: 2 });
  }
  await page.mouse.up();
}
