// Shared steps for browser tests: signing in as a demo account and checking accessibility.
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
