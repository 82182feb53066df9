// Informed consent in the running app: the demo patient answers the health questions, reads and
// ticks each part, and signs with a drawn stroke on a 390 px phone; the dentist reviews it on a
// tablet; the sealed PDF reads back with pdfjs-dist; the clinic's check spots a changed byte; and
// the patient's copy arrives in the mail catcher (the worker, which `npm test` starts, sends it).
import { createHash } from "node:crypto";
import { expect, test } from "@playwright/test";
import { pdfText } from "../support/pdf-text";
import { drawSignature, expectNoAxeViolations, signIn, query } from "./support";

const catcher = process.env.MAIL_CATCHER_URL;


/** The demo patient's seeded upcoming visit (tooth 15, confirmed), whose consent the patient signs here. */
async function zoeVisit(): Promise<string> {
  const [row] = await query<{ id: string }>(
    `SELECT a.id FROM appointments a JOIN patients p ON p.id = a.patient_id JOIN users u ON u.id = p.user_id
      WHERE u.email = 'patient@cuspal.test' AND a.tooth = 15 AND a.status = 'confirmed' AND a.starts_at > now()
      ORDER BY a.starts_at LIMIT 1`,
  );
  expect(row, "the demo patient's upcoming visit").toBeTruthy();
  return row.id;
}

test.describe.serial("informed consent", () => {
  let visitId: string;
  let signedStartedAt: Date;

  test("the demo patient signs on a phone with a drawn signature", async ({ page }) => {
    test.setTimeout(180_000);
    visitId = await zoeVisit();
    // A consent left signed by an earlier run is withdrawn first, as the patient may do before the visit.
    const [live] = await query<{ id: string; status: string }>("SELECT id, status FROM consents WHERE appointment_id = $1 AND status <> 'withdrawn'", [visitId]);
    await signIn(page, "patient@cuspal.test");
    await expect(page).toHaveURL(/\/patient$/);
    if (live && live.status !== "pending") {
      expect((await page.request.post(`/api/consents/${live.id}/withdraw`, { data: { reason: "Signing again in a test run." } })).status()).toBe(200);
    }
    signedStartedAt = new Date();

    await page.goto(`/patient/visits/${visitId}`);
    await expect(page.getByTestId("visit-consent")).toContainText("Consent not signed yet");
    await page.getByRole("link", { name: "Read and sign your consent" }).click();
    await expect(page).toHaveURL(new RegExp(`/patient/visits/${visitId}/consent$`));
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("Consent for your crown");
    await expect(page.getByTestId("cautions-note")).toContainText("licensed practice prevail");

    // Step 1: the questionnaire refuses to go on with questions unanswered.
    await page.getByRole("button", { name: "Continue to the consent" }).click();
    await expect(page.getByText("Choose an answer.").first()).toBeVisible();
    for (const fieldset of await page.locator("fieldset[data-testid^='question-']").all()) {
      const key = (await fieldset.getAttribute("data-testid"))!.replace("question-", "");
      const answer = key === "allergyLatex" ? "Yes" : key === "grinding" ? "Not sure" : "No";
      await fieldset.getByRole("radio", { name: answer, exact: true }).check();
    }
    await page.getByLabel("Medicines you take (optional)").fill("Vitamin D");
    await expectNoAxeViolations(page);
    await page.screenshot({ path: "test-results/consent-questionnaire-390.png", fullPage: true });
    await page.getByRole("button", { name: "Continue to the consent" }).click();

    // Step 2: every part must be ticked.
    await expect(page.getByRole("heading", { name: "Step 2 of 3: Read the consent" })).toBeFocused();
    await expect(page.getByTestId("section-material")).toContainText("About your material: Lithium disilicate");
    await expect(page.getByTestId("section-alternatives")).toContainText("dental laboratory over two visits");
    const ticks = page.getByRole("checkbox", { name: "I have read and understood this part" });
    await expect(ticks).toHaveCount(7);
    for (const tick of (await ticks.all()).slice(0, 6)) await tick.check();
    await page.getByRole("button", { name: "Continue to signing" }).click();
    await expect(page.getByText("Please read and tick every section before signing.")).toBeVisible();
    await ticks.last().check();
    await expectNoAxeViolations(page);
    await page.getByRole("button", { name: "Continue to signing" }).click();

    // Step 3: records agreement, typed name, drawn signature; empty and trivial drawings are refused.
    await expect(page.getByRole("heading", { name: "Step 3 of 3: Sign" })).toBeFocused();
    await page.getByRole("button", { name: "Sign consent" }).click();
    await expect(page.getByText("Please agree to sign and receive records electronically, or ask the clinic for paper.")).toBeVisible();
    await page.getByRole("checkbox", { name: "I agree to sign and receive these records electronically" }).check();
    await page.getByLabel("Type your full name").fill("Zoë Halvorsen-Ruiz");
    await page.getByRole("button", { name: "Sign consent" }).click();
    await expect(page.getByText("Please draw your signature in the box.")).toBeVisible();
    const box = (await page.getByTestId("signature-canvas").boundingBox())!;
    await page.mouse.click(box.x + box.width / 2, box.y + box.height / 2); // a single dot
    await page.getByRole("button", { name: "Sign consent" }).click();
    await expect(page.getByText(/too small or too simple/)).toBeVisible();
    await page.getByRole("button", { name: "Clear the box" }).click();
    await drawSignature(page);
    await expectNoAxeViolations(page);
    await page.screenshot({ path: "test-results/consent-sign-390.png", fullPage: true });
    await page.getByRole("button", { name: "Sign consent" }).click();

    await expect(page.getByTestId("signed-summary")).toContainText("Signed by Zoë Halvorsen-Ruiz", { timeout: 30_000 });
    await expect(page.getByTestId("consent-status")).toHaveText("Signed, waiting for review");
    await expectNoAxeViolations(page);

    // The database holds the proof: typed name, drawn image, IP, device, fingerprint of the text.
    const userAgent = await page.evaluate(() => navigator.userAgent);
    const [row] = await query<{ id: string; status: string; typed_name: string; signed_user_agent: string; signature_png: Buffer; text_sha256: string; consent_text: string; flags: { key: string }[] }>(
      "SELECT id, status, typed_name, signed_user_agent, signature_png, text_sha256, consent_text, flags FROM consents WHERE appointment_id = $1 AND status <> 'withdrawn'",
      [visitId],
    );
    expect(row).toMatchObject({ status: "signed", typed_name: "Zoë Halvorsen-Ruiz", signed_user_agent: userAgent });
    expect(row.signature_png.subarray(1, 4).toString("latin1")).toBe("PNG");
    expect(row.text_sha256).toBe(createHash("sha256").update(row.consent_text, "utf8").digest("hex"));
    expect(row.flags.map((f) => f.key)).toEqual(["allergyLatex", "grinding"]);

    // The PDF link serves the sealed PDF, which reads back with the visit and the audit page.
    const pdfRes = await page.request.get(await page.getByTestId("consent-pdf-link").getAttribute("href") as string);
    expect(pdfRes.headers()["content-type"]).toBe("application/pdf");
    const pdf = await pdfRes.body();
    const text = await pdfText(pdf);
    expect(text).toContain("Zoë Halvorsen-Ruiz");
    expect(text).toContain("15 (Universal 4) — upper right second premolar");
    expect(text).toContain("Lithium disilicate (ISO 6872 class 3)");
    expect(text).toContain("Consent text version 1");
    expect(text).toContain("Audit trail");
    expect(text).toContain("Consent signed by the patient");
    expect(text).toMatch(/ALERT\s+Latex allergy/);
  });

  test("the patient's copy of the sealed PDF reaches the mail catcher", async ({ request }) => {
    test.skip(!catcher, "MAIL_CATCHER_URL is not set");
    type Caught = { id: string; subject: string; time: string; to: { address: string }[]; headers: Record<string, string>; attachments?: { filename: string; generatedFileName: string; contentType: string }[] };
    let mail: Caught | undefined;
    await expect.poll(async () => {
      const all = (await (await request.get(`${catcher}/api/email`)).json()) as Caught[];
      mail = all.find((m) => m.subject === "Your copy of your signed consent" && m.headers["x-cuspal-visit"] === visitId
        && m.to.some((t) => t.address === "patient@cuspal.test") && new Date(m.time) >= new Date(signedStartedAt.getTime() - 5000));
      return !!mail;
    }, { timeout: 30_000, message: "the consent copy in the catcher" }).toBe(true);
    const attachment = mail!.attachments!.find((a) => a.contentType === "application/pdf")!;
    expect(attachment.filename).toMatch(/^consent-tooth-15-\d{4}-\d{2}-\d{2}-v1\.pdf$/);
    const bytes = await (await request.get(`${catcher}/api/email/${mail!.id}/attachment/${encodeURIComponent(attachment.generatedFileName)}`)).body();
    const [v1] = await query<{ sha256: string }>(
      "SELECT p.sha256 FROM consent_pdfs p JOIN consents c ON c.id = p.consent_id WHERE c.appointment_id = $1 AND c.status <> 'withdrawn' AND p.version = 1",
      [visitId],
    );
    expect(createHash("sha256").update(bytes).digest("hex")).toBe(v1.sha256);
  });

  test.describe("chairside", () => {
    test.use({ viewport: { width: 1024, height: 768 } });

    test("the dentist sees today's consents, reviews the signed one, and the PDF gets a reviewed version", async ({ page }) => {
      test.setTimeout(180_000);
      await signIn(page, "dentist@cuspal.test");
      await expect(page).toHaveURL(/\/clinic$/);
      await page.getByRole("link", { name: "Consents", exact: true }).click();
      await expect(page.getByRole("heading", { level: 1 })).toHaveText("Consents today");
      // The seeded visit today: signed and sealed, with a blood-thinner flag.
      const tobias = page.getByTestId("consent-row").filter({ hasText: "Tobias Renfrew" });
      await expect(tobias).toContainText("Check: Takes blood thinners");
      await expect(tobias.getByTestId("consent-status")).toHaveText(/Signed/);
      await expectNoAxeViolations(page);
      await page.screenshot({ path: "test-results/consents-today-1024.png", fullPage: true });
      // Below today's list, every consent record of the clinic, newest first, a page at a time.
      await expect(page.getByRole("heading", { level: 2, name: "All consent records" })).toBeVisible();
      await expect(page.getByTestId("consent-record").filter({ hasText: "Tobias Renfrew" }).first()).toBeVisible();
      await page.goto("/clinic/consents?cursor=not-a-page-of-ours");
      await expect(page.getByTestId("consent-records-invalid")).toContainText("That page link is not valid.");
      await expect(page.getByTestId("consent-row").first()).toBeVisible();

      await page.goto(`/clinic/consents/${visitId}`);
      await expect(page.getByRole("heading", { level: 1 })).toHaveText("Zoë Halvorsen-Ruiz");
      await expect(page.getByTestId("flag-allergyLatex")).toContainText("Alert: Latex allergy");
      await expect(page.getByTestId("flag-grinding")).toContainText("The patient is not sure.");
      await expect(page.getByTestId("consent-pdf-frame")).toHaveAttribute("src", /\/api\/consents\/[0-9a-f-]{36}\/pdf$/);
      await expectNoAxeViolations(page);
      await page.screenshot({ path: "test-results/consent-review-1024.png", fullPage: true });
      await page.getByRole("button", { name: "Mark as reviewed" }).click();
      await expect(page.getByTestId("reviewed-note")).toContainText("Reviewed by Dr Amara Quist", { timeout: 30_000 });
      await expect(page.getByTestId("consent-status")).toHaveText("Signed and reviewed");

      const [consent] = await query<{ id: string; status: string }>("SELECT id, status FROM consents WHERE appointment_id = $1 AND status <> 'withdrawn'", [visitId]);
      expect(consent.status).toBe("reviewed");
      const latest = await (await page.request.get(`/api/consents/${consent.id}/pdf`)).body();
      const first = await (await page.request.get(`/api/consents/${consent.id}/pdf?version=1`)).body();
      const text = await pdfText(latest);
      expect(text).toContain("Consent reviewed by the dentist");
      expect(text).toContain("Dr Amara Quist (dentist)");
      expect(text).toContain(createHash("sha256").update(first).digest("hex"));
      expect(await pdfText(first)).not.toContain("Consent reviewed by the dentist");

      // The API contract for the list.
      const list = await (await page.request.get("/api/consents?status=reviewed")).json();
      expect(list.consents).toContainEqual(expect.objectContaining({ id: consent.id, appointmentId: visitId, status: "reviewed", signedAt: expect.any(String) }));
      expect(list.nextCursor).toBeNull();
    });

    test("staff check a PDF: the issued file matches, one changed byte does not", async ({ page }) => {
      test.setTimeout(90_000);
      const [consent] = await query<{ id: string }>("SELECT id FROM consents WHERE appointment_id = $1 AND status <> 'withdrawn'", [visitId]);
      const [stored] = await query<{ pdf: Buffer }>("SELECT pdf FROM consent_pdfs WHERE consent_id = $1 ORDER BY version LIMIT 1", [consent.id]);
      const changed = Buffer.from(stored.pdf);
      changed[Math.floor(changed.length / 3)] ^= 0x01;

      await signIn(page, "reception@cuspal.test");
      await expect(page).toHaveURL(/\/clinic$/);
      await page.goto("/clinic/consents/verify");
      await page.getByLabel("Consent PDF").setInputFiles({ name: "consent.pdf", mimeType: "application/pdf", buffer: stored.pdf });
      await page.getByRole("button", { name: "Check" }).click();
      await expect(page.getByTestId("verify-result")).toContainText("Matches: this is an unaltered consent issued by this clinic.");
      await expect(page.getByTestId("verify-result")).toContainText(consent.id);
      await expectNoAxeViolations(page);

      await page.getByLabel("Consent PDF").setInputFiles({ name: "consent.pdf", mimeType: "application/pdf", buffer: changed });
      await page.getByRole("button", { name: "Check" }).click();
      await expect(page.getByTestId("verify-result")).toContainText("Does not match");

      const res = await page.request.post("/api/consents/verify", { multipart: { file: { name: "changed.pdf", mimeType: "application/pdf", buffer: changed } } });
      expect(await res.json()).toEqual({ match: false });
      const ok = await page.request.post("/api/consents/verify", { multipart: { file: { name: "consent.pdf", mimeType: "application/pdf", buffer: stored.pdf } } });
      expect(await ok.json()).toEqual({ match: true, consentId: consent.id });
    });

    test("a patient gets 404 for another patient's consent PDF", async ({ page }) => {
      const [other] = await query<{ id: string }>(
        "SELECT c.id FROM consents c JOIN patients p ON p.id = c.patient_id JOIN users u ON u.id = p.user_id WHERE u.email <> 'patient@cuspal.test' AND c.status <> 'pending' LIMIT 1",
      );
      await signIn(page, "patient@cuspal.test");
      await expect(page).toHaveURL(/\/patient$/);
      const res = await page.request.get(`/api/consents/${other.id}/pdf`);
      expect(res.status()).toBe(404);
      expect(await res.json()).toEqual({ error: "That consent was not found." });
    });
  });
});
