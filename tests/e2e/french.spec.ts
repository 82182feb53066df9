// A French-speaking patient on a 390 px phone: a fr-CA browser gets the French sign-in page; the
// demo patient switches to French, books, answers the questionnaire and signs in French; the sealed
// PDF (read back with pdfjs-dist) is French with its accents intact; the confirmation e-mail in the
// mail catcher is in French. The patient is switched back to English at the end.
import { expect, test, type BrowserContext, type Page } from "@playwright/test";
import { jpegWithGps } from "../support/sample-files";
import { pdfText } from "../support/pdf-text";
import { DEMO_PASSWORD, drawSignature, query, signIn } from "./support";

const catcher = process.env.MAIL_CATCHER_URL;

// Common English words of our UI; none may appear on a French page ([C] our own list, no source).
const ENGLISH_WORDS = ["Sign in", "Password", "Your", "visit", "Book", "Hello", "the", "and", "with", "Compare", "Documents are", "Cancel", "Language"];

/** The page's visible text without what people typed (a dentist's note is in whatever language they wrote it). */
async function visibleText(page: Page): Promise<string> {
  const typed = await page.locator("[data-free-text]").allInnerTexts();
  return typed.reduce((text, t) => text.split(t).join(" "), await page.locator("body").innerText());
}

function englishWordsIn(text: string, more: string[] = []): string[] {
  // Names of people, the clinic and places are invented data and stay as they are.
  const cleaned = text.replace(/Zoë Halvorsen-Ruiz|English|Cuspal/g, "");
  return [...ENGLISH_WORDS, ...more].filter((w) => new RegExp(`\\b${w}\\b`).test(cleaned));
}

// The English words of the details and documents screens ([C] our own list, no source).
const DETAILS_AND_DOCUMENTS_WORDS = ["My details", "Mobile phone", "E-mail", "Save", "Download", "records", "Upload", "Take a photo", "Choose a file", "Title", "Added by", "Sent so far", "Insurance card", "No file chosen", "Account"];

test.use({ locale: "fr-CA" });

test("a French-speaking patient books, signs and is written to in French", async ({ page, browser, request }) => {
  test.setTimeout(240_000);
  let visitId: string | null = null;
  let staff: BrowserContext | null = null;
  // An open proposal of its own (tooth 36, the same materials as the seeded one), so the journey does
  // not depend on whether an earlier test already booked the seeded proposal.
  const [proposal] = await query<{ id: string }>(
    `WITH src AS (SELECT pr.* FROM proposals pr JOIN patients p ON p.id = pr.patient_id JOIN users u ON u.id = p.user_id
                   WHERE u.email = 'patient@cuspal.test' AND pr.tooth = 36 ORDER BY pr.created_at LIMIT 1),
          made AS (INSERT INTO proposals (clinic_id, patient_id, dentist_id, tooth, fee_cents, note)
                   SELECT clinic_id, patient_id, dentist_id, tooth, fee_cents, NULL FROM src RETURNING id),
          mats AS (INSERT INTO proposal_materials (proposal_id, material_id, modes)
                   SELECT made.id, pm.material_id, pm.modes FROM made, proposal_materials pm JOIN src ON pm.proposal_id = src.id)
     SELECT id FROM made`,
  );
  try {
    // Signed out, the browser's Accept-Language decides.
    await page.goto("/sign-in");
    await expect(page.locator("html")).toHaveAttribute("lang", "fr");
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("Connexion");
    expect(englishWordsIn(await visibleText(page))).toEqual([]);
    await page.screenshot({ path: "test-results/french-sign-in-390.png", fullPage: true });

    await page.getByLabel("Courriel", { exact: true }).fill("patient@cuspal.test");
    await page.getByLabel("Mot de passe").fill(DEMO_PASSWORD);
    await page.getByRole("button", { name: "Se connecter", exact: true }).click();
    await page.waitForURL(/\/patient$/);

    // Signed in, the patient's saved preference decides; the switcher saves French.
    await page.getByTestId("language-switcher").getByRole("button", { name: "Français" }).click();
    await expect(page.locator("html")).toHaveAttribute("lang", "fr");
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("Bonjour, Zoë");
    const [pref] = await query<{ language: string }>("SELECT p.language FROM patients p JOIN users u ON u.id = p.user_id WHERE u.email = 'patient@cuspal.test'");
    expect(pref.language).toBe("fr");
    expect(englishWordsIn(await visibleText(page))).toEqual([]);

    // Book the open proposal in French.
    await page.goto(`/patient/proposals/${proposal.id}`);
    await expect(page.getByRole("heading", { level: 1 })).toHaveText(/première molaire inférieure gauche/i);
    await page.getByRole("radio", { name: /Zircone/ }).check();
    await page.getByRole("radio", { name: /Standard/ }).check();
    const picker = page.getByTestId("slot-picker");
    await expect(picker.getByRole("group", { name: "Jours avec des plages libres" })).toBeVisible();
    await picker.getByRole("group", { name: /Heures de début/ }).getByRole("button").first().click();
    expect(englishWordsIn(await visibleText(page))).toEqual([]);
    await page.screenshot({ path: "test-results/french-booking-390.png", fullPage: true });
    await page.getByRole("button", { name: "Demander ce rendez-vous" }).click();
    await page.waitForURL(/\/patient\/visits\/[0-9a-f-]+$/);
    visitId = page.url().split("/").pop()!;
    await expect(page.getByTestId("visit-status")).toHaveText("En attente de confirmation par la clinique");

    // Reception (staff pages stay in English) confirms the request.
    staff = await browser.newContext({ locale: "en-CA" });
    const reception = await staff.newPage();
    await signIn(reception, "reception@cuspal.test");
    expect((await reception.request.post(`/api/appointments/${visitId}/confirm`)).status()).toBe(200);

    // Questionnaire and signature in French.
    await page.goto(`/patient/visits/${visitId}/consent`);
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("Consentement pour votre couronne");
    for (const fieldset of await page.locator("fieldset[data-testid^='question-']").all()) {
      await fieldset.getByRole("radio", { name: "Non", exact: true }).check();
    }
    await page.getByRole("button", { name: "Continuer vers le consentement" }).click();
    await expect(page.getByTestId("section-material")).toContainText("Votre matériau : Zircone");
    for (const tick of await page.getByRole("checkbox", { name: "J'ai lu et compris cette partie" }).all()) await tick.check();
    await page.getByRole("button", { name: "Continuer vers la signature" }).click();
    await expect(page.getByRole("heading", { name: "Étape 3 sur 3 : Signer" })).toBeFocused();
    await page.getByRole("checkbox", { name: "J'accepte de signer et de recevoir ces documents par voie électronique" }).check();
    await page.getByLabel("Tapez votre nom complet").fill("Zoë Halvorsen-Ruiz");
    await page.getByTestId("signature-canvas").scrollIntoViewIfNeeded();
    await drawSignature(page);
    expect(englishWordsIn(await visibleText(page))).toEqual([]);
    await page.screenshot({ path: "test-results/french-sign-390.png", fullPage: true });
    await page.getByRole("button", { name: "Signer le consentement" }).click();
    await expect(page.getByTestId("signed-summary")).toContainText("Signé par Zoë Halvorsen-Ruiz", { timeout: 30_000 });

    const [row] = await query<{ language: string; consent_text: string }>("SELECT language, consent_text FROM consents WHERE appointment_id = $1 AND status <> 'withdrawn'", [visitId]);
    expect(row.language).toBe("fr");

    // The sealed PDF is French, accents intact.
    const pdf = await (await page.request.get((await page.getByTestId("consent-pdf-link").getAttribute("href"))!)).body();
    const text = (await pdfText(pdf)).replace(/\s+/g, " ");
    expect(text).toContain("Votre rendez-vous");
    expect(text).toContain("Consentement à une couronne en une seule visite");
    for (const ch of ["é", "è", "à", "ç"]) expect(text, ch).toContain(ch);
    expect(text).toContain("Français (fr)");

    // The confirmation e-mail in the catcher is French.
    if (catcher) {
      type Caught = { subject: string; headers: Record<string, string>; text?: string };
      const confirmations = async () => ((await (await request.get(`${catcher}/api/email`)).json()) as Caught[])
        .filter((m) => m.headers["x-cuspal-visit"] === visitId && m.subject.startsWith("Confirmé :"));
      await expect.poll(async () => (await confirmations()).length, { timeout: 120_000 }).toBe(1);
      expect((await confirmations())[0].subject).toMatch(/^Confirmé : votre rendez-vous pour une couronne le /);
    }
  } finally {
    // Leave the demo patient as the other tests expect: the visit cancelled, English again.
    // Reception may cancel at any time before the visit starts (the patient only until the cut-off).
    if (visitId && staff) await staff.request.post(`/api/appointments/${visitId}/cancel`, { data: { reason: "End of the test run." } });
    await staff?.close();
    await query("UPDATE proposals SET status = 'closed' WHERE id = $1", [proposal.id]);
    await query("UPDATE patients SET language = 'en' WHERE user_id = (SELECT id FROM users WHERE email = 'patient@cuspal.test')");
  }
});

test("a French-speaking patient's details and documents are in French", async ({ page }) => {
  test.setTimeout(120_000);
  await query("UPDATE patients SET language = 'fr' WHERE user_id = (SELECT id FROM users WHERE email = 'patient@cuspal.test')");
  try {
    await page.goto("/sign-in");
    await page.getByLabel("Courriel", { exact: true }).fill("patient@cuspal.test");
    await page.getByLabel("Mot de passe").fill(DEMO_PASSWORD);
    await page.getByRole("button", { name: "Se connecter", exact: true }).click();
    await page.waitForURL(/\/patient$/);

    // "Mes coordonnées": headings, labels, hints and the button.
    await page.getByRole("navigation", { name: "Rubriques" }).getByRole("link", { name: "Mes coordonnées" }).click();
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("Mes coordonnées");
    await expect(page.locator("html")).toHaveAttribute("lang", "fr");
    await expect(page.getByLabel("Téléphone mobile")).toBeVisible();
    await expect(page.getByRole("radio", { name: "Français" })).toBeChecked();
    await expect(page.getByRole("link", { name: "Télécharger mon dossier" })).toBeVisible();
    expect(englishWordsIn(await visibleText(page), DETAILS_AND_DOCUMENTS_WORDS)).toEqual([]);
    await page.screenshot({ path: "test-results/french-details-390.png", fullPage: true });

    // The documents page, with one upload so the list shows its words too.
    await page.goto("/patient/documents");
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("Vos documents");
    await page.getByLabel("De quoi s'agit-il?").selectOption({ label: "Photo de la dent" });
    await expect(page.getByLabel("Titre")).toHaveValue("Photo de la dent");
    const title = `Photo de la dent ${Date.now()}`;
    await page.getByLabel("Titre").fill(title);
    await page.getByLabel("Choisir un fichier").setInputFiles({ name: "dent.jpg", mimeType: "image/jpeg", buffer: await jpegWithGps() });
    await expect(page.getByTestId("chosen-file")).toContainText("Choisi : dent.jpg");
    expect(englishWordsIn(await visibleText(page), DETAILS_AND_DOCUMENTS_WORDS)).toEqual([]);
    await page.getByRole("button", { name: "Téléverser" }).click();
    await expect(page.getByTestId("upload-done")).toHaveText(`Téléversé : ${title}`, { timeout: 30_000 });
    const item = page.getByTestId("document-list").getByRole("listitem").filter({ hasText: title });
    await expect(item).toContainText("Ajouté par vous le");
    await expect(item).toContainText("Photo JPEG");
    await expect(item.getByRole("link", { name: /^Ouvrir/ })).toBeVisible();
    expect(englishWordsIn(await visibleText(page), DETAILS_AND_DOCUMENTS_WORDS)).toEqual([]);
    await page.screenshot({ path: "test-results/french-documents-390.png", fullPage: true });
  } finally {
    await query("UPDATE patients SET language = 'en' WHERE user_id = (SELECT id FROM users WHERE email = 'patient@cuspal.test')");
  }
});
