// The clinic manager edits a material's English and French patient texts: the both-languages cautions
// rule is explained and enforced in the browser, a save is audited, and reception cannot open the page.
import { expect, test } from "@playwright/test";
import { expectNoAxeViolations, query, signIn } from "./support";

test("material texts: the manager saves both languages; French cautions cannot be dropped; reception is sent away", async ({ page, browser }) => {
  await page.setViewportSize({ width: 1280, height: 900 });
  await signIn(page, "admin@cuspal.test");
  await page.goto("/clinic/settings/materials");
  await expect(page.getByRole("heading", { name: "Material texts for patients" })).toBeVisible();
  await expect(page.getByTestId("cautions-note")).toContainText("licensed practice prevail");
  await page.screenshot({ path: ".data/material-texts-1280.png", fullPage: false });
  await expectNoAxeViolations(page);

  const zr = page.getByRole("region", { name: /^Zirconia/ });
  const frCautions = zr.locator("fieldset[lang=fr]").getByLabel("Cautions (one per line)");
  const kept = await frCautions.inputValue();
  await frCautions.fill("");
  await zr.getByRole("button", { name: "Save texts" }).click();
  await expect(zr.getByText(/Give the French cautions too/)).toBeVisible();

  await frCautions.fill(kept);
  await zr.getByRole("button", { name: "Save texts" }).click();
  await expect(zr.getByRole("status")).toContainText("Texts saved");
  const audits = await query<{ n: string }>(
    `SELECT count(*) AS n FROM audit_events a JOIN materials m ON m.id::text = a.subject_id WHERE a.action = 'settings.material_texts' AND m.key = 'zirconia'`,
  );
  expect(Number(audits[0].n)).toBeGreaterThan(0);

  const phone = await browser.newPage({ viewport: { width: 390, height: 844 } });
  await signIn(phone, "admin@cuspal.test");
  await phone.goto("/clinic/settings/materials");
  await phone.screenshot({ path: ".data/material-texts-390.png", fullPage: false });

  const reception = await browser.newPage();
  await signIn(reception, "reception@cuspal.test");
  await reception.goto("/clinic/settings/materials");
  await expect(reception).not.toHaveURL(/settings\/materials/);
});
