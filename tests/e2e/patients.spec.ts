// A patient who was never seeded: reception registers and invites them at a desk, the invitation's
// link signs them in on a phone, the dentist proposes a crown from their page, and they see it.
import { expect, test, type Browser } from "@playwright/test";
import { expectNoAxeViolations, query, signIn } from "./support";

const catcher = process.env.MAIL_CATCHER_URL;
const DESK = { width: 1280, height: 900 };
const PHONE = { width: 390, height: 844 };

async function pageFor(browser: Browser, viewport: { width: number; height: number }, email?: string) {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  if (email) await signIn(page, email);
  return page;
}

async function invitationLink(address: string): Promise<string> {
  for (let i = 0; i < 50; i++) {
    const all = (await (await fetch(`${catcher}/api/email`)).json()) as { to: { address: string }[]; subject: string; text?: string }[];
    const mail = all.find((m) => m.to.some((t) => t.address.toLowerCase() === address) && /invites you|vous invite/.test(m.subject));
    const link = mail?.text?.match(/https?:\/\/\S+\/api\/auth\/callback\/email\?\S+/)?.[0];
    if (link) return link;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error("The invitation did not reach the mail catcher.");
}

test.describe("patient records", () => {
  test("reception registers and invites a new patient, the link signs them in on a phone, and they see the dentist's proposal", async ({ browser }) => {
    test.setTimeout(180_000);
    const tag = Date.now().toString(36);
    const email = `maelle.quintal.${tag}@example.test`;
    const name = `Maëlle Quintal-${tag}`;

    const reception = await pageFor(browser, DESK, "reception@cuspal.test");
    await reception.goto("/clinic/patients");
    await reception.getByRole("link", { name: "Register a patient" }).click();
    await expect(reception.getByRole("heading", { level: 1 })).toHaveText("Register a patient");
    // A bad phone and an impossible date are refused in the form, with a message at each field.
    await reception.getByLabel("Full name").fill(name);
    await reception.getByLabel("Date of birth").fill("1991-06-12");
    await reception.getByLabel("E-mail", { exact: true }).fill(email);
    await reception.getByLabel("Mobile phone (optional)").fill("555 01");
    await reception.getByRole("button", { name: "Register patient" }).click();
    await expect(reception.locator("#patient-phone-error")).toContainText("Enter a mobile number");
    await reception.getByLabel("Mobile phone (optional)").fill("613 555 0127");
    await reception.getByRole("radio", { name: "French" }).check();
    await reception.getByLabel("Postal address (optional)").fill("7 Rue des Érables, Gatineau QC");
    await expectNoAxeViolations(reception);
    await reception.screenshot({ path: "test-results/patient-register-1280.png", fullPage: true });
    await reception.getByRole("button", { name: "Register patient" }).click();

    await expect(reception).toHaveURL(/\/clinic\/patients\/[0-9a-f-]{36}/);
    const patientId = new URL(reception.url()).pathname.split("/").pop()!;
    await expect(reception.getByRole("heading", { level: 1 })).toHaveText(name);
    await expect(reception.getByText("(613) 555-0127")).toBeVisible();
    await expect(reception.getByTestId("invitation-state")).toHaveText("Not invited yet");
    const [row] = await query<{ phone: string; language: string }>("SELECT phone, language FROM patients WHERE id = $1", [patientId]);
    expect(row).toEqual({ phone: "+16135550127", language: "fr" });

    await reception.getByRole("button", { name: "Send invitation" }).click();
    await expect(reception.getByRole("status")).toContainText("Invitation sent");
    await expect(reception.getByTestId("invitation-state")).toContainText("Invited");
    await expectNoAxeViolations(reception);
    await reception.screenshot({ path: "test-results/patient-page-1280.png", fullPage: true });

    // The same person again (name in other case and without accents, same birthday) is refused with a link to the first.
    await reception.goto("/clinic/patients/new");
    await reception.getByLabel("Full name").fill(name.toUpperCase().replace("Ë", "E"));
    await reception.getByLabel("Date of birth").fill("1991-06-12");
    await reception.getByLabel("E-mail", { exact: true }).fill(`other.${email}`);
    await reception.getByRole("button", { name: "Register patient" }).click();
    const problem = reception.getByTestId("register-problem");
    await expect(problem).toContainText("already registered");
    await expect(problem.getByRole("link", { name: "Open the patient already registered" })).toHaveAttribute("href", `/clinic/patients/${patientId}`);
    expect(await query("SELECT 1 FROM users WHERE email = $1", [`other.${email}`])).toHaveLength(0);

    // Search finds her without the accent.
    await reception.goto(`/clinic/patients?q=${encodeURIComponent(`maelle quintal-${tag}`)}`);
    await expect(reception.getByRole("link", { name })).toBeVisible();

    // The e-mailed link signs the new patient in on a phone; she was registered as French-speaking.
    const link = await invitationLink(email);
    const phone = await pageFor(browser, PHONE);
    await phone.goto(link);
    await expect(phone).toHaveURL(/\/patient$/);
    // She was registered as French-speaking, so her pages speak French.
    await expect(phone.getByRole("heading", { level: 1 })).toHaveText("Bonjour, Maëlle");
    const [signedIn] = await query<{ first_signed_in_at: Date | null }>("SELECT first_signed_in_at FROM patients WHERE id = $1", [patientId]);
    expect(signedIn.first_signed_in_at).not.toBeNull();
    // The link works once.
    const again = await pageFor(browser, PHONE);
    await again.goto(link);
    await expect(again).not.toHaveURL(/\/patient$/);

    // The dentist proposes a crown from her page.
    const dentist = await pageFor(browser, DESK, "dentist@cuspal.test");
    await dentist.goto(`/clinic/patients/${patientId}`);
    await dentist.getByRole("link", { name: "Propose a crown" }).click();
    await expect(dentist.getByLabel("Patient", { exact: true })).toHaveValue(patientId);
    await dentist.getByLabel("Tooth (ISO 3950, two digits)").fill("36");
    await dentist.locator("div.rounded-lg").filter({ hasText: "Zirconia" }).first().getByLabel("Standard").check();
    await dentist.getByLabel("Fee (CAD)").fill("1250");
    await dentist.getByRole("button", { name: "Send proposal to the patient" }).click();
    await expect(dentist).toHaveURL(/\/clinic$/);

    await phone.reload();
    await expect(phone.getByRole("link", { name: "Comparer et réserver" })).toHaveCount(1);
    await expect(phone.getByText(/Dent 36/)).toBeVisible();
    await phone.screenshot({ path: "test-results/patient-first-proposal-390.png", fullPage: true });

    // Her own details and the download of her records.
    await phone.goto("/patient/profile");
    await expect(phone.getByLabel("Téléphone mobile")).toHaveValue("(613) 555-0127");
    await expect(phone.getByRole("radio", { name: "Français" })).toBeChecked();
    await expectNoAxeViolations(phone);
    await phone.screenshot({ path: "test-results/patient-profile-390.png", fullPage: true });
    const zip = await phone.request.get("/api/me/export");
    expect(zip.status()).toBe(200);
    expect(zip.headers()["content-type"]).toBe("application/zip");
    // [P] APPNOTE.TXT (PKWARE ZIP specification) §4.3.7: a local file header starts with "PK\x03\x04".
    expect((await zip.body()).subarray(0, 4).toString("latin1")).toBe("PK\x03\x04");

    // Archived, she can no longer sign in with a link.
    await reception.goto(`/clinic/patients/${patientId}`);
    reception.once("dialog", (d) => void d.accept());
    await reception.getByRole("button", { name: "Archive patient" }).click();
    await expect(reception.getByRole("button", { name: "Unarchive patient" })).toBeVisible();
    const [archived] = await query<{ active: boolean }>("SELECT u.active FROM users u JOIN patients p ON p.user_id = u.id WHERE p.id = $1", [patientId]);
    expect(archived.active).toBe(false);
  });
});
