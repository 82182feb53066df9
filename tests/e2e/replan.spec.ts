// A day with one late milling, at desktop width: the board shows the shift, the visit's equipment
// holds move with it, and a time that could be booked before on that mill is refused with alternatives.
import { expect as baseExpect, test, type Browser, type Page } from "@playwright/test";
import { query, signIn } from "./support";

test.use({ viewport: { width: 1280, height: 900 }, hasTouch: false });
const expect = baseExpect.configure({ timeout: 20_000 });

/** A weekday four weeks ahead, in clinic time, with no demo visits. */
function dayAhead(): string {
  const d = new Date(Date.now() + 28 * 86_400_000);
  while ([0, 6].includes(d.getUTCDay())) d.setUTCDate(d.getUTCDate() + 1);
  return d.toISOString().slice(0, 10);
}

async function staffPage(browser: Browser, email: string): Promise<Page> {
  const page = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
  await signIn(page, email);
  return page;
}

test("a milling 20 minutes late moves the visit's holds and a booking that fitted before is refused", async ({ browser }) => {
  test.setTimeout(240_000);
  const day = dayAhead();
  const [clinic] = await query<{ id: string }>("SELECT id FROM clinics WHERE slug = 'alder-bay'");
  const [hybrid] = await query<{ id: string }>("SELECT id FROM materials WHERE clinic_id = $1 AND key = 'resin-ceramic-hybrid'", [clinic.id]);
  const dentists = await query<{ id: string; email: string }>("SELECT id, email FROM users WHERE clinic_id = $1 AND role = 'dentist' ORDER BY email", [clinic.id]);
  const amara = dentists.find((d) => d.email === "dentist@cuspal.test")!;
  const felix = dentists.find((d) => d.email !== "dentist@cuspal.test")!;
  const patients = await query<{ id: string }>("SELECT p.id FROM patients p JOIN users u ON u.id = p.user_id WHERE p.clinic_id = $1 AND u.email IN ('henrik.oyelaran@cuspal.test', 'marisol.akande@cuspal.test') ORDER BY u.email", [clinic.id]);
  const [millB] = await query<{ id: string }>("SELECT id FROM equipment WHERE clinic_id = $1 AND kind = 'mill' AND name = 'Mill B'", [clinic.id]);
  // One mill that day: Mill B is out of service, so the late milling meets the next crown on Mill A.
  await query("INSERT INTO equipment_outages (equipment_id, during, reason) VALUES ($1, tstzrange(($2::date)::timestamp AT TIME ZONE 'America/Toronto', ($2::date + 1)::timestamp AT TIME ZONE 'America/Toronto'), 'Browser test')", [millB.id, day]);

  const admin = await staffPage(browser, "admin@cuspal.test");
  const propose = async (patientId: string, dentistId: string) => {
    const res = await admin.request.post("/api/proposals", { data: { patientId, dentistId, tooth: 36, fee: 900, options: [{ materialId: hybrid.id, modes: ["standard"] }] } });
    expect(res.status()).toBe(201);
    return (await res.json()).id as string;
  };
  const first = await propose(patients[0].id, amara.id);
  const second = await propose(patients[1].id, felix.id);
  const slots = async (proposalId: string) => {
    const res = await admin.request.get(`/api/proposals/${proposalId}/availability?materialId=${hybrid.id}&mode=standard&from=${day}&days=1`);
    expect(res.ok()).toBe(true);
    return ((await res.json()).slots as { start: string }[]).map((s) => s.start);
  };
  const created: string[] = [];
  try {
    // The first visit at 08:00 mills from 09:10 to 09:22.
    const firstStart = (await slots(first)).find((s) => s.slice(11, 16) === "08:00")!;
    const booked = await admin.request.post("/api/appointments", { data: { proposalId: first, materialId: hybrid.id, mode: "standard", start: firstStart } });
    expect(booked.status()).toBe(201);
    const visit = (await booked.json()).id as string;
    created.push(visit);
    expect((await admin.request.post(`/api/appointments/${visit}/confirm`)).ok()).toBe(true);
    // A second crown at 08:15 with the other dentist would mill from 09:25: free now.
    const wanted = (await slots(second)).find((s) => s.slice(11, 16) === "08:15");
    expect(wanted, "08:15 is bookable before the late milling").toBeTruthy();

    // Consent signed and reviewed, so treatment may start.
    const [template] = await query<{ id: string; version: number }>("SELECT id, version FROM consent_templates WHERE clinic_id = $1 AND status = 'published' LIMIT 1", [clinic.id]);
    await query(
      `INSERT INTO consents (clinic_id, appointment_id, patient_id, status, template_id, template_version, answers, acknowledged, electronic_records_version,
         consent_text, text_sha256, typed_name, signature_png, signed_at, reviewed_at, reviewed_by)
       SELECT clinic_id, id, patient_id, 'reviewed', $2, $3, '{}'::jsonb, '{}', 'test', 'Consent text', repeat('a', 64), 'Browser Test', '\\x89504e47', now(), now(), $4
         FROM appointments WHERE id = $1`,
      [visit, template.id, template.version, amara.id],
    );

    // The dentist runs the visit on plan, then the milling finishes 20 minutes late.
    const dentist = await staffPage(browser, "dentist@cuspal.test");
    const stages = await query<{ key: string; s: string; e: string }>("SELECT key, planned_start AS s, planned_end AS e FROM appointment_stages WHERE appointment_id = $1 ORDER BY seq", [visit]);
    const markAt = async (key: string, action: string, at: Date) => {
      const res = await dentist.request.post(`/api/appointments/${visit}/stages/${key}`, { data: { action, at: at.toISOString() } });
      expect(res.ok(), `${action} ${key}`).toBe(true);
    };
    for (const s of stages) {
      await markAt(s.key, "start", new Date(s.s));
      if (s.key === "fabrication") {
        await markAt(s.key, "finish", new Date(new Date(s.e).getTime() + 20 * 60_000));
        break;
      }
      await markAt(s.key, "finish", new Date(s.e));
    }

    // The holds moved: the mill until 09:42, the try-in 20 minutes later.
    const holds = await query<{ stage: string; kind: string; lo: Date; hi: Date }>("SELECT stage, resource_kind AS kind, lower(during) AS lo, upper(during) AS hi FROM reservations WHERE appointment_id = $1 AND active", [visit]);
    const mill = holds.find((h) => h.kind === "mill")!;
    const fab = stages.find((s) => s.key === "fabrication")!;
    expect(new Date(mill.hi).getTime() - new Date(fab.e).getTime()).toBe(20 * 60_000);
    const tryIn = holds.find((h) => h.stage === "try_in" && h.kind === "chair")!;
    expect(new Date(tryIn.lo).getTime() - new Date(stages.find((s) => s.key === "try_in")!.s).getTime()).toBe(20 * 60_000);

    // The board shows the shift.
    await dentist.goto(`/clinic/board?day=${day}`);
    await expect(dentist.getByText("20 min late").first()).toBeVisible();
    await dentist.screenshot({ path: "test-results/replan-board-1280.png", fullPage: true });

    // The time that fitted before is no longer offered, and booking it is refused with alternatives.
    expect(await slots(second)).not.toContain(wanted);
    const refused = await admin.request.post("/api/appointments", { data: { proposalId: second, materialId: hybrid.id, mode: "standard", start: wanted } });
    expect(refused.status()).toBe(409);
    const body = await refused.json();
    expect(body.alternatives.length).toBeGreaterThan(0);
    expect(body.alternatives.map((a: { start: string }) => a.start)).not.toContain(wanted);
  } finally {
    for (const id of created) await query("UPDATE appointments SET status = 'cancelled' WHERE id = $1", [id]).catch(() => undefined);
    await query("UPDATE reservations SET active = false WHERE appointment_id = ANY($1::uuid[])", [created]);
    await query("DELETE FROM equipment_outages WHERE equipment_id = $1 AND reason = 'Browser test'", [millB.id]);
    await query("UPDATE proposals SET status = 'withdrawn' WHERE id = ANY($1::uuid[])", [[first, second]]).catch(() => undefined);
  }
});
