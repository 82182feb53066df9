// Documents in the browser: the demo patient uploads a photo from a phone-sized screen, and
// reception opens it from the patient's page. Checks the screen, the stored bytes and the database.
import { expect, test, type Page } from "@playwright/test";
import exifr from "exifr";
import sharp from "sharp";
import { jpegWithGps, SAMPLE_GPS } from "../support/sample-files";
import { expectNoAxeViolations, signIn, query } from "./support";


/** A photo-sized JPEG (noise does not compress, so the upload takes a moment) with a GPS block. */
async function phonePhoto(): Promise<Buffer> {
  const noisy = await sharp({ create: { width: 1000, height: 750, channels: 3, background: "#a07050", noise: { type: "gaussian", mean: 128, sigma: 40 } } })
    .jpeg({ quality: 92 })
    .toBuffer();
  const tagged = await jpegWithGps();
  // Swap in the noisy picture behind the hand-written EXIF block of the small sample.
  const exifEnd = 2 + 2 + tagged.readUInt16BE(4);
  return Buffer.concat([tagged.subarray(0, exifEnd), noisy.subarray(2)]);
}

async function openDocuments(page: Page) {
  await signIn(page, "patient@cuspal.test");
  await expect(page).toHaveURL(/\/patient$/);
  await page.getByRole("navigation", { name: "Sections" }).getByRole("link", { name: "Documents" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Your documents");
}

test("the demo patient uploads a photo at 390 px and reception opens it without its location", async ({ page }) => {
  test.slow();
  const title = `Tooth photo ${Date.now()}`;
  const photo = await phonePhoto();
  expect((await exifr.gps(photo))?.latitude).toBeCloseTo(SAMPLE_GPS.latitude, 6);
  expect(page.viewportSize()?.width).toBe(390);

  await openDocuments(page);
  await expectNoAxeViolations(page);
  await page.getByLabel("What is it?").selectOption({ label: "Tooth photo" });
  await expect(page.getByLabel("Title")).toHaveValue("Tooth photo");
  await page.getByLabel("Title").fill(title);
  await page.getByLabel("Choose a file").setInputFiles({ name: "IMG_2041.jpg", mimeType: "image/jpeg", buffer: photo });
  await expect(page.getByTestId("chosen-file")).toContainText("IMG_2041.jpg");

  // Slow the upload down so the progress bar has something to show.
  const cdp = await page.context().newCDPSession(page);
  await cdp.send("Network.enable");
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 400 * 1024 });
  await page.getByRole("button", { name: "Upload" }).click();
  await expect(page.getByText(/^Uploading \d+ %$/)).toBeVisible();
  await expect(page.getByRole("progressbar")).toBeVisible();
  await page.screenshot({ path: test.info().outputPath("patient-uploading-390.png"), fullPage: true });
  await expect(page.getByTestId("upload-done")).toHaveText(`Uploaded: ${title}`, { timeout: 30_000 });
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

  const item = page.getByTestId("document-list").getByRole("listitem").filter({ hasText: title });
  await expect(item).toContainText("Tooth photo");
  await expect(item).toContainText("Added by you");
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  await expectNoAxeViolations(page);
  await page.screenshot({ path: test.info().outputPath("patient-documents-390.png"), fullPage: true });

  const [row] = await query<{ id: string; uploader_role: string; content_type: string; object_key: string }>(
    "SELECT id, uploader_role, content_type, object_key FROM documents WHERE title = $1",
    [title],
  );
  expect(row).toMatchObject({ uploader_role: "patient", content_type: "image/jpeg" });
  expect(row.object_key).toMatch(/^documents\/[0-9a-f-]{36}\/[0-9a-f-]{36}$/);

  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/$/);
  await page.setViewportSize({ width: 1280, height: 900 });
  await signIn(page, "reception@cuspal.test");
  await expect(page).toHaveURL(/\/clinic$/);
  await page.getByRole("navigation", { name: "Sections" }).getByRole("link", { name: "Patients" }).click();
  await expectNoAxeViolations(page);
  await page.getByRole("link", { name: "Zoë Halvorsen-Ruiz" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Zoë Halvorsen-Ruiz");
  const staffItem = page.getByTestId("document-list").getByRole("listitem").filter({ hasText: title });
  await expect(staffItem).toContainText("Added by Zoë Halvorsen-Ruiz (Patient)");
  await expectNoAxeViolations(page);
  await page.screenshot({ path: test.info().outputPath("staff-patient-1280.png"), fullPage: true });

  const [response] = await Promise.all([
    page.waitForResponse((r) => r.url().endsWith(`/api/documents/${row.id}`)),
    staffItem.getByRole("link", { name: `Open ${title}` }).click(),
  ]);
  expect(response.status()).toBe(200);
  expect(response.headers()["content-type"]).toBe("image/jpeg");
  // The bytes reception receives are the stored ones: read them with a general-purpose EXIF reader.
  const served = await response.body();
  expect(await exifr.gps(served)).toBeUndefined();
  // Sent as 1000 × 750 with EXIF orientation 6 ("rotate 90° clockwise to view" [M]): stored upright.
  const meta = await sharp(served).metadata();
  expect([meta.width, meta.height]).toEqual([750, 1000]);

  const [reception] = await query<{ id: string }>("SELECT id FROM users WHERE email = $1", ["reception@cuspal.test"]);
  const views = await query<{ action: string }>(
    "SELECT action FROM audit_events WHERE subject_id = $1 AND actor_user_id = $2 AND action = 'document.viewed'",
    [row.id, reception.id],
  );
  expect(views.length).toBeGreaterThanOrEqual(1);
});

test("the patient is told clearly about a file that is not a photo, and can retry a failed upload", async ({ page }) => {
  await openDocuments(page);
  await page.getByLabel("What is it?").selectOption({ label: "Insurance card (front)" });
  await page.getByLabel("Choose a file").setInputFiles({ name: "card.jpg", mimeType: "image/jpeg", buffer: Buffer.from("<html>not a photo</html>") });
  await page.getByRole("button", { name: "Upload" }).click();
  await expect(page.getByTestId("file-error")).toContainText("This file is not a photo (JPEG, PNG or WebP) or a PDF");
  await expectNoAxeViolations(page);

  const title = `Card front ${Date.now()}`;
  await page.getByLabel("Title").fill(title);
  await page.getByLabel("Choose a file").setInputFiles({ name: "card.jpg", mimeType: "image/jpeg", buffer: await jpegWithGps() });
  // The first attempt never reaches the server.
  await page.route("**/api/documents", (route) => route.abort("connectionreset"), { times: 1 });
  await page.getByRole("button", { name: "Upload" }).click();
  await expect(page.getByTestId("upload-error")).toHaveText("The upload did not get through. Check your connection, then try again.");
  expect(await query("SELECT 1 FROM documents WHERE title = $1", [title])).toHaveLength(0);
  await page.getByRole("button", { name: "Try again" }).click();
  await expect(page.getByTestId("upload-done")).toHaveText(`Uploaded: ${title}`);
  await expect(page.getByTestId("document-list")).toContainText(title);
  expect(await query("SELECT 1 FROM documents WHERE title = $1", [title])).toHaveLength(1);
});

test("a file over 15 MB is refused in the browser before it is sent", async ({ page }) => {
  // Handing 16 MB to the browser takes a while on a small machine.
  test.slow();
  await openDocuments(page);
  let posted = false;
  page.on("request", (r) => {
    if (r.method() === "POST" && r.url().endsWith("/api/documents")) posted = true;
  });
  const big = Buffer.concat([await jpegWithGps(), Buffer.alloc(16 * 1024 * 1024)]);
  await page.getByLabel("Choose a file").setInputFiles({ name: "huge.jpg", mimeType: "image/jpeg", buffer: big });
  await expect(page.getByTestId("file-error")).toContainText("the limit is 15 MB");
  await page.getByLabel("What is it?").selectOption({ label: "Tooth photo" });
  await page.getByRole("button", { name: "Upload" }).click();
  await expect(page.getByTestId("file-error")).toContainText("the limit is 15 MB");
  expect(posted).toBe(false);
});
