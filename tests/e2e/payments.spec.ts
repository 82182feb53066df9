// Deposits on a phone, end to end: the patient books, pays on the payment fake's page through the
// SDK (a declined card first), sees it paid, gets the receipt by e-mail; the clinic declines and the
// deposit comes back with a refund receipt; an unpaid booking's hold is released and its time offered again.
import { expect, test, type APIRequestContext, type Browser, type Page } from "@playwright/test";
import { expectNoAxeViolations, query, signIn } from "./support";

const catcher = process.env.MAIL_CATCHER_URL;
type Caught = { subject: string; time: string; to: { address: string }[]; headers: Record<string, string> };

async function signedInPage(browser: Browser, email: string, viewport = { width: 390, height: 844 }) {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  await signIn(page, email);
  return page;
}

async function mailFor(request: APIRequestContext, visitId: string, subject: RegExp) {
  let found: Caught | undefined;
  await expect.poll(async () => {
    const all = (await (await request.get(`${catcher}/api/email`)).json()) as Caught[];
    found = all.find((m) => subject.test(m.subject) && m.headers["x-cuspal-visit"] === visitId && m.to.some((t) => t.address === "patient@cuspal.test"));
    return !!found;
  }, { timeout: 30_000, message: `an e-mail matching ${subject} in the catcher` }).toBe(true);
  return found!;
}

/** The demo patient's first proposal, made free of any earlier visit from other browser tests. */
async function freeDemoProposal(): Promise<string> {
  const [p] = await query<{ id: string }>(
    `SELECT pr.id FROM proposals pr JOIN patients pa ON pa.id = pr.patient_id JOIN users u ON u.id = pa.user_id
      WHERE u.email = 'patient@cuspal.test' AND pr.status = 'open' AND pr.tooth = 36`,
  );
  await query(`UPDATE reservations SET active = false WHERE appointment_id IN (SELECT id FROM appointments WHERE proposal_id = $1)`, [p.id]);
  await query(`UPDATE appointments SET status = 'cancelled' WHERE proposal_id = $1 AND status IN ('requested', 'confirmed')`, [p.id]);
  return p.id;
}

async function book(page: Page, proposalId: string) {
  await page.goto(`/patient/proposals/${proposalId}`);
  // Each material shows its own fee beside its pros and cautions.
  await expect(page.getByTestId("material-fee").first()).toContainText("$");
  await page.getByRole("radio", { name: /Zirconia/ }).check();
  await page.getByRole("radio", { name: /Standard/ }).check();
  const picker = page.getByTestId("slot-picker");
  // The day's last start, so the time is still bookable (past the clinic's notice) when the test looks again.
  await picker.getByRole("group", { name: /Start times/ }).getByRole("button").last().click();
  await page.getByRole("button", { name: "Request this visit" }).click();
  await expect(page).toHaveURL(/\/patient\/visits\/[0-9a-f-]{36}$/);
  return page.url().split("/").pop()!;
}

test.describe("deposits", () => {
  test("pay on the fake's page, receipt, decline and refund; an unpaid hold is released", async ({ browser, request }) => {
    test.skip(!catcher, "MAIL_CATCHER_URL is not set");
    test.setTimeout(180_000);
    const proposalId = await freeDemoProposal();
    const page = await signedInPage(browser, "patient@cuspal.test");
    const visitId = await book(page, proposalId);
    await expect(page.getByTestId("deposit-status")).toHaveText(/Deposit due · \$200\.00/);
    await page.screenshot({ path: "test-results/deposit-due-390.png", fullPage: true });
    await expectNoAxeViolations(page);

    await page.getByRole("button", { name: "Pay the $200.00 deposit" }).click();
    await expect(page.getByRole("heading", { name: "Pay 200.00 CAD" })).toBeVisible();
    await page.getByLabel("Card number").fill("4000 0000 0000 0002");
    await page.getByRole("button", { name: "Pay" }).click();
    await expect(page.getByRole("alert")).toContainText("Your card was declined");
    expect((await query<{ status: string }>("SELECT status FROM deposits WHERE appointment_id = $1", [visitId]))[0].status).toBe("due");

    await page.getByLabel("Card number").fill("4242 4242 4242 4242");
    await page.getByRole("button", { name: "Pay" }).click();
    await expect(page).toHaveURL(new RegExp(`/patient/visits/${visitId}\\?deposit=returned$`));
    await expect(page.getByTestId("deposit-status")).toHaveText(/Deposit paid · \$200\.00/);
    await expect(page.getByRole("link", { name: "Download the receipt (PDF)" })).toBeVisible();
    await page.screenshot({ path: "test-results/deposit-paid-390.png", fullPage: true });
    await mailFor(request, visitId, /^Receipt: your \$200\.00 deposit/);
    const audit = await query<{ action: string }>("SELECT action FROM audit_events WHERE subject_id = $1 ORDER BY id", [visitId]);
    expect(audit.map((a) => a.action)).toEqual(expect.arrayContaining(["deposit.asked", "deposit.checkout_opened", "deposit.paid"]));

    // The clinic declines: the deposit comes back in full, with a refund receipt.
    const reception = await signedInPage(browser, "reception@cuspal.test", { width: 1280, height: 900 });
    const declined = await reception.request.post(`/api/appointments/${visitId}/decline`, { data: { reason: "The mill is being serviced that day." } });
    expect(declined.status()).toBe(200);
    await expect.poll(async () => (await query<{ status: string }>("SELECT status FROM deposits WHERE appointment_id = $1", [visitId]))[0].status).toBe("refunded");
    await mailFor(request, visitId, /^Refund receipt: your \$200\.00 deposit/);
    expect(await query("SELECT 1 FROM audit_events WHERE subject_id = $1 AND action = 'deposit.refunded'", [visitId])).toHaveLength(1);

    // Staff screens: the visit's money block, the payments table, and the manager's settings.
    await reception.goto(`/clinic/visits/${visitId}`);
    await expect(reception.getByTestId("deposit-status")).toHaveText(/Deposit refunded · \$200\.00/);
    await reception.screenshot({ path: "test-results/staff-visit-money-1280.png", fullPage: true });
    await reception.goto("/clinic/payments?status=refunded");
    await expect(reception.getByTestId("payment-totals")).toContainText("Deposit refunded: $");
    await expectNoAxeViolations(reception);
    await reception.screenshot({ path: "test-results/staff-payments-1280.png", fullPage: true });
    const manager = await signedInPage(browser, "admin@cuspal.test", { width: 1280, height: 900 });
    await manager.goto("/clinic/settings/payments");
    await expect(manager.getByLabel("Fixed amount (CAD)")).toHaveValue("200.00");
    await expect(manager.getByLabel("Zirconia")).toHaveValue("1450.00");
    await manager.screenshot({ path: "test-results/settings-payments-1280.png", fullPage: true });

    // Book again and leave it unpaid; age the deposit past the 30-minute hold; the worker's job releases it.
    const unpaidId = await book(page, proposalId);
    const [{ starts_at: start }] = await query<{ starts_at: Date }>("SELECT starts_at FROM appointments WHERE id = $1", [unpaidId]);
    await query("UPDATE deposits SET created_at = now() - interval '31 minutes' WHERE appointment_id = $1", [unpaidId]);
    await expect.poll(async () => (await query<{ status: string }>("SELECT status FROM appointments WHERE id = $1", [unpaidId]))[0].status, { timeout: 30_000 }).toBe("cancelled");
    expect((await query<{ status: string }>("SELECT status FROM deposits WHERE appointment_id = $1", [unpaidId]))[0].status).toBe("released");
    await page.reload();
    await expect(page.getByTestId("deposit-status")).toHaveText(/Not paid in time/);
    const day = new Date(start).toLocaleDateString("en-CA", { timeZone: "America/Toronto" });
    const avail = await page.request.get(`/api/proposals/${proposalId}/availability?materialId=${(await query<{ material_id: string }>("SELECT material_id FROM appointments WHERE id = $1", [unpaidId]))[0].material_id}&mode=standard&from=${day}&days=1`);
    expect(avail.status()).toBe(200);
    const { slots } = (await avail.json()) as { slots: { start: string }[] };
    expect(slots.map((s) => new Date(s.start).toISOString())).toContain(new Date(start).toISOString());
  });
});
