import { expect, test, type Browser } from "@playwright/test";
import { expectNoAxeViolations, signIn, query } from "./support";


async function signedInPage(browser: Browser, email: string, viewport = { width: 390, height: 844 }) {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  await signIn(page, email);
  return page;
}

test.describe("booking a crown visit", () => {
  test("the demo patient books from a phone, reception confirms, and the database holds the reservations", async ({ browser }) => {
    test.setTimeout(180_000);
    const page = await signedInPage(browser, "patient@cuspal.test");
    await expect(page).toHaveURL(/\/patient$/);
    await page.getByRole("link", { name: "Compare and book" }).first().click();
    await expect(page.getByRole("heading", { level: 1 })).toHaveText(/lower left first molar/i);
    await expect(page.getByTestId("material-card")).toHaveCount(3);
    await expectNoAxeViolations(page);

    await page.getByRole("radio", { name: /Zirconia/ }).check();
    await page.getByRole("radio", { name: /Standard/ }).check();
    const picker = page.getByTestId("slot-picker");
    await expect(picker.getByRole("group", { name: "Days with free times" })).toBeVisible();
    await picker.getByRole("group", { name: /Start times/ }).getByRole("button").first().click();
    await expect(page.getByTestId("review-start")).not.toBeEmpty();
    await page.screenshot({ path: "test-results/booking-review-390.png", fullPage: true });
    await page.getByRole("button", { name: "Request this visit" }).click();

    await expect(page).toHaveURL(/\/patient\/visits\/[0-9a-f-]{36}$/);
    const visitId = page.url().split("/").pop()!;
    await expect(page.getByTestId("visit-status")).toHaveText("Waiting for the clinic to confirm");
    await expect(page.getByTestId("visit-timeline")).toContainText("Sintering");
    await expectNoAxeViolations(page);

    const reception = await signedInPage(browser, "reception@cuspal.test", { width: 1280, height: 900 });
    await reception.goto("/clinic/requests");
    const row = reception.getByTestId("request-row").filter({ hasText: "Zoë Halvorsen-Ruiz" });
    await expect(row).toHaveCount(1);
    await expectNoAxeViolations(reception);
    await row.getByRole("button", { name: /Confirm visit of Zoë/ }).click();
    await expect(reception.getByTestId("request-row").filter({ hasText: "Zoë Halvorsen-Ruiz" })).toHaveCount(0);

    const [visit] = await query<{ status: string; mode: string }>("SELECT status, mode FROM appointments WHERE id = $1", [visitId]);
    expect(visit).toEqual({ status: "confirmed", mode: "standard" });
    const reservations = await query<{ resource_kind: string; n: string }>(
      "SELECT resource_kind, count(*) AS n FROM reservations WHERE appointment_id = $1 AND active GROUP BY resource_kind ORDER BY resource_kind", [visitId]);
    // Zirconia, stained and glazed: chair for every stage but aftercare (11), dentist for six stages, one mill stage,
    // and the furnace twice: sintering and the glaze firing.
    expect(reservations).toEqual([
      { resource_kind: "chair", n: "11" }, { resource_kind: "dentist", n: "6" }, { resource_kind: "furnace", n: "2" }, { resource_kind: "mill", n: "1" },
    ]);
    const audit = await query<{ action: string }>("SELECT action FROM audit_events WHERE subject_id = $1 ORDER BY id", [visitId]);
    expect(audit.map((a) => a.action)).toEqual(expect.arrayContaining(["visit.requested", "visit.confirmed"]));

    // The patient now sees the confirmation.
    await page.reload();
    await expect(page.getByTestId("visit-status")).toHaveText("Confirmed");
  });
});

test.describe("booking API", () => {
  test("follows the contract and refuses bad input with JSON errors", async ({ browser }) => {
    const page = await signedInPage(browser, "patient@cuspal.test");
    const api = page.request;
    const { proposals } = await (await api.get("/api/proposals")).json();
    expect(proposals.length).toBeGreaterThanOrEqual(1);
    const p = proposals.find((x: { tooth: { fdi: number } }) => x.tooth.fdi === 15) ?? proposals[0];
    expect(p.materials[0]).toEqual(expect.objectContaining({ id: expect.any(String), name: expect.any(String), modes: expect.any(Array) }));

    const m = p.materials[0];
    const avail = await api.get(`/api/proposals/${p.id}/availability?materialId=${m.id}&mode=${m.modes[0]}&days=5`);
    expect(avail.status()).toBe(200);
    const body = await avail.json();
    expect(body.timezone).toBe("America/Toronto");
    for (const s of body.slots) expect(s.start).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:00-0[45]:00$/);

    const bad = [
      [await api.get(`/api/proposals/${p.id}/availability?materialId=${m.id}&mode=${m.modes[0]}&days=999`), 400, "days"],
      [await api.get(`/api/proposals/${p.id}/availability?materialId=${m.id}&mode=turbo`), 400, "mode"],
      [await api.get(`/api/proposals/00000000-0000-4000-8000-000000000000/availability?materialId=${m.id}&mode=rapid`), 404, undefined],
      [await api.post("/api/appointments", { data: "{not json", headers: { "content-type": "application/json" } }), 400, undefined],
      [await api.post("/api/appointments", { data: { proposalId: p.id } }), 400, "materialId"],
      [await api.post("/api/appointments", { data: { proposalId: p.id, materialId: m.id, mode: m.modes[0], start: "2020-01-06T08:00:00-05:00" } }), 400, "start"],
    ] as const;
    for (const [res, status, field] of bad) {
      expect(res.status(), await res.text()).toBe(status);
      const json = await res.json();
      expect(typeof json.error).toBe("string");
      if (field) expect(json.field).toBe(field);
    }

    // Another patient's visit is a 404, not a 403.
    const [other] = await query<{ id: string }>("SELECT a.id FROM appointments a JOIN patients p ON p.id = a.patient_id JOIN users u ON u.id = p.user_id WHERE u.email <> 'patient@cuspal.test' LIMIT 1");
    expect((await api.get(`/api/appointments/${other.id}/timeline`)).status()).toBe(404);
    expect((await api.post(`/api/appointments/${other.id}/confirm`)).status()).toBe(403);
  });

  test("the timeline endpoint lists the stages with their equipment", async ({ browser }) => {
    const page = await signedInPage(browser, "dentist@cuspal.test", { width: 1024, height: 768 });
    const [visit] = await query<{ id: string }>("SELECT id FROM appointments ORDER BY starts_at LIMIT 1");
    const res = await page.request.get(`/api/appointments/${visit.id}/timeline`);
    expect(res.status()).toBe(200);
    const t = await res.json();
    expect(t.stages.length).toBeGreaterThanOrEqual(10);
    expect(t.stages[0]).toEqual(expect.objectContaining({ key: "check_in", label: "Check-in", start: expect.stringMatching(/-0[45]:00$/), equipment: [expect.objectContaining({ kind: "chair" })] }));
    expect(t.end).toBe(t.stages.at(-1).end);
  });
});
