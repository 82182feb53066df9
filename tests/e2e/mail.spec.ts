// E-mail in the running app: reception's confirmation reaches the patient once, with its calendar
// file (needs the worker, which `npm test` starts), and the reminder link page works on a phone.
import { expect, test, type APIRequestContext } from "@playwright/test";
import ICAL from "ical.js";
import { reminderToken } from "../../lib/mail/reminder-token";
import { expectNoAxeViolations, signIn, query } from "./support";

const catcher = process.env.MAIL_CATCHER_URL;


/** A visit of its own for an invented demo patient, weeks ahead, so no other spec sees it. */
async function insertVisit(status: "requested" | "confirmed", daysAhead: number): Promise<{ id: string; startsAt: Date; email: string }> {
  const email = "henrik.oyelaran@cuspal.test";
  const start = new Date(Date.now() + daysAhead * 86_400_000);
  start.setUTCHours(15, 0, 0, 0);
  const [row] = await query<{ id: string; starts_at: Date }>(
    `WITH c AS (SELECT id FROM clinics WHERE slug = 'alder-bay'),
          p AS (SELECT p.id FROM patients p JOIN users u ON u.id = p.user_id WHERE u.email = $1),
          d AS (SELECT id FROM users WHERE email = 'dentist@cuspal.test'),
          prop AS (
            INSERT INTO proposals (clinic_id, patient_id, dentist_id, tooth, fee_cents, note)
            SELECT c.id, p.id, d.id, 26, 130000, 'Crown for the upper left first molar.' FROM c, p, d
            RETURNING id, clinic_id, patient_id, dentist_id)
     INSERT INTO appointments (clinic_id, proposal_id, patient_id, dentist_id, material_id, mode, tooth, status, starts_at, ends_at, chair_id, mill_id, fee_cents)
     SELECT prop.clinic_id, prop.id, prop.patient_id, prop.dentist_id,
            (SELECT id FROM materials WHERE clinic_id = prop.clinic_id AND key = 'zirconia'), 'standard', 26, $2, $3::timestamptz,
            $3::timestamptz + interval '150 minutes',
            (SELECT id FROM equipment WHERE clinic_id = prop.clinic_id AND kind = 'chair' ORDER BY name LIMIT 1),
            (SELECT id FROM equipment WHERE clinic_id = prop.clinic_id AND kind = 'mill' ORDER BY name LIMIT 1), 130000
       FROM prop
     RETURNING id, starts_at`,
    [email, status, start.toISOString()],
  );
  return { id: row.id, startsAt: new Date(row.starts_at), email };
}

type Caught = { id: string; subject: string; to: { address: string }[]; headers: Record<string, string>; attachments?: { filename: string; generatedFileName: string; contentType: string }[] };

async function confirmationsFor(request: APIRequestContext, visitId: string): Promise<Caught[]> {
  const all = (await (await request.get(`${catcher}/api/email`)).json()) as Caught[];
  return all.filter((m) => m.headers["x-cuspal-visit"] === visitId && m.subject.startsWith("Confirmed:"));
}

test.describe("visit e-mail", () => {
  test("confirming a visit through the API sends the patient exactly one confirmation with the .ics", async ({ page, request }) => {
    test.skip(!catcher, "MAIL_CATCHER_URL is not set");
    // The worker may still be working through mail queued by earlier steps of the run.
    test.setTimeout(150_000);
    const visit = await insertVisit("requested", 45);
    await signIn(page, "reception@cuspal.test");
    await expect(page).toHaveURL(/\/clinic/);
    const res = await page.request.post(`/api/appointments/${visit.id}/confirm`);
    expect(res.status()).toBe(200);
    expect(await res.json()).toEqual({ id: visit.id, status: "confirmed" });

    // The worker picks it up within a few seconds (more if it has a backlog).
    await expect.poll(async () => (await confirmationsFor(request, visit.id)).length, { timeout: 120_000 }).toBe(1);
    await page.waitForTimeout(2500);
    const mails = await confirmationsFor(request, visit.id);
    expect(mails).toHaveLength(1);
    expect(mails[0].to.map((t) => t.address)).toEqual([visit.email]);
    const ics = mails[0].attachments?.find((a) => a.contentType === "text/calendar");
    expect(ics?.filename).toBe("crown-visit.ics");
    const text = await (await request.get(`${catcher}/api/email/${mails[0].id}/attachment/${ics!.generatedFileName}`)).text();
    // Parsed with ical.js; RFC 5545 §3.6.1 [P]: UID and DTSTAMP present, DTEND and DURATION not both.
    const vevent = new ICAL.Component(ICAL.parse(text)).getFirstSubcomponent("vevent")!;
    expect(vevent.getFirstPropertyValue("uid")).toBe(`visit-${visit.id}@cuspal`);
    expect(vevent.hasProperty("dtstamp")).toBe(true);
    expect(new ICAL.Event(vevent).startDate.toJSDate().getTime()).toBe(visit.startsAt.getTime());
    expect(vevent.hasProperty("dtend") && vevent.hasProperty("duration")).toBe(false);

    const log = await query<{ kind: string; state: string }>(`SELECT kind, state FROM mail_outbox WHERE appointment_id = $1 AND kind = 'visit_confirmed'`, [visit.id]);
    expect(log).toEqual([{ kind: "visit_confirmed", state: "sent" }]);
  });

  test("the reminder link turns reminders off and back on from a phone; a forged link does nothing", async ({ page, request }) => {
    const visit = await insertVisit("confirmed", 50);
    const token = reminderToken(visit.id, visit.startsAt);
    const enabled = async () => (await query<{ on: boolean }>(`SELECT reminders_enabled AS on FROM appointments WHERE id = $1`, [visit.id]))[0].on;

    await page.goto(`/reminders/${token}`);
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("Reminders for your crown visit");
    await expect(page.getByText("Alder Bay Dental Studio,")).toContainText(/Eastern (Standard|Daylight) Time/);
    await expect(page.getByText(/Reminders are on/)).toBeVisible();
    await expectNoAxeViolations(page);
    await page.screenshot({ path: "test-results/reminder-link-390.png", fullPage: true });

    await page.getByRole("button", { name: "Turn off reminders" }).click();
    await expect(page.getByRole("status")).toHaveText("Done: reminders for this visit are off.");
    await expect(page.getByText(/Reminders are off/)).toBeVisible();
    expect(await enabled()).toBe(false);
    await expectNoAxeViolations(page);
    await page.screenshot({ path: "test-results/reminder-link-off-390.png", fullPage: true });

    await page.getByRole("button", { name: "Turn reminders back on" }).click();
    await expect(page.getByRole("status")).toHaveText("Done: reminders for this visit are on again.");
    expect(await enabled()).toBe(true);

    // A GET never changes anything (link scanners); the one-click POST of RFC 8058 [P] does.
    const get = await request.get(`/api/reminders/${token}`, { maxRedirects: 0 });
    expect(get.status()).toBe(303);
    expect(await enabled()).toBe(true);
    const oneClick = await request.post(`/api/reminders/${token}`, { form: { "List-Unsubscribe": "One-Click" } });
    expect(oneClick.status()).toBe(200);
    expect(await oneClick.json()).toEqual({ remindersEnabled: false });
    expect(await enabled()).toBe(false);

    const forged = `${visit.id}.${"A".repeat(43)}`;
    await page.goto(`/reminders/${forged}`);
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("This link does not work");
    const bad = await request.post(`/api/reminders/${forged}`, { form: { enabled: "true" } });
    expect(bad.status()).toBe(404);
    expect((await bad.json()).error).toMatch(/link/i);
    expect(await enabled()).toBe(false);
    const junk = await request.post(`/api/reminders/${token}`, { data: { enabled: "yes" } });
    expect(junk.status()).toBe(400);
  });
});
