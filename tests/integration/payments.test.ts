// Deposits end to end against PostgreSQL and the local payment fake (STRIPE_API_URL), through the
// official SDK: booking asks the deposit, the fake's hosted page takes the test card, the webhook
// route verifies signatures with the SDK and handles each event once, refunds go back through the
// SDK, and unpaid holds are released. Only the session is faked.
import { NextRequest } from "next/server";
import { QueryTypes } from "sequelize";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { AuditEvent, Clinic, Material, ProposalMaterial, Reservation, sequelize } from "@/db/models";
import { proposalSchema } from "@/lib/booking/schemas";
import { createProposal } from "@/lib/data/proposals";
import { bookVisit } from "@/lib/booking/book";
import { searchSlots } from "@/lib/booking/search";
import { cancelVisit, declineVisit } from "@/lib/booking/transitions";
import { payments } from "@/lib/payments/client";
import { depositOf, startCheckout } from "@/lib/payments/deposits";
import { releaseUnpaidHolds } from "@/lib/payments/release";
import { createTestClinic, createTestPatient, createTestProposal, type TestClinic } from "../support/fixtures";
import { setSessionUser } from "../support/session";
import { sessionOf } from "../support/session";

vi.mock("@/lib/auth/session", async () => (await import("../support/session")).fakeSessionModule());

const { POST: webhookRoute } = await import("@/app/api/payments/webhook/route");
const { GET: visitRoute } = await import("@/app/api/appointments/[id]/route");
const { GET: paymentsRoute } = await import("@/app/api/payments/route");
const { GET: receiptRoute } = await import("@/app/api/appointments/[id]/receipt/route");
const { PUT: planRoute } = await import("@/app/api/proposals/[id]/plan-estimate/route");

async function pdfText(bytes: Uint8Array): Promise<string> {
  const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
  const doc = await pdfjs.getDocument({ data: bytes, useSystemFonts: false, isEvalSupported: false }).promise;
  const parts: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    parts.push(content.items.map((it) => ("str" in it ? it.str : "")).join(" "));
  }
  return parts.join("\n");
}

const now = new Date("2027-03-01T12:00:00Z");
let t: TestClinic;
let slot = 0;
// Each booking takes its own weekday morning from Monday 2027-03-08, 08:00 in Toronto (EST, UTC−5).
function nextStart() {
  const d = new Date(Date.UTC(2027, 2, 8, 13));
  for (let n = slot++; n > 0; ) {
    d.setUTCDate(d.getUTCDate() + 1);
    if (d.getUTCDay() !== 0 && d.getUTCDay() !== 6) n -= 1;
  }
  return d;
}
// The SDK as the app configures it, against the fake named by STRIPE_API_URL.
const sdk = payments();
const asUser = sessionOf;

beforeAll(async () => {
  t = await createTestClinic({ chairs: 2, mills: 1, furnaces: 1 });
  // The demo clinic's policy: a fixed $200 deposit, refundable until 48 hours before.
  await Clinic.update({ depositKind: "fixed", depositValue: 20_000, depositRefundHours: 48 }, { where: { id: t.clinic.id } });
});

afterEach(() => {
  setSessionUser(null);
});

async function bookOne() {
  const { user, patient } = await createTestPatient(t.clinic.id);
  const proposal = await createTestProposal(t, patient.id);
  const actor = { user: asUser(user) };
  const visit = await bookVisit({ proposalId: proposal.id, materialId: t.materialByKey["zirconia"].id, mode: "standard", start: nextStart(), actor, now });
  return { actor, visit, patient, proposal };
}

function signed(payload: string, secret = process.env.STRIPE_WEBHOOK_SECRET!) {
  return sdk.webhooks.generateTestHeaderString({ payload, secret });
}

async function deliver(event: object, signature?: string) {
  const payload = JSON.stringify(event);
  const req = new NextRequest("http://localhost/api/payments/webhook", {
    method: "POST",
    body: payload,
    headers: { "content-type": "application/json", "stripe-signature": signature ?? signed(payload) },
  });
  const res = await webhookRoute(req, undefined);
  return { status: res.status, body: await res.json() };
}

const completedEvent = (id: string, o: { depositId: string; amount: number; intent: string; session?: string }) => ({
  id, object: "event", type: "checkout.session.completed", created: Math.floor(Date.now() / 1000),
  data: { object: { id: o.session ?? `cs_test_${id}`, object: "checkout.session", payment_status: "paid", status: "complete", amount_total: o.amount, currency: "cad", payment_intent: o.intent, client_reference_id: o.depositId, metadata: { depositId: o.depositId } } },
});
const refundedEvent = (id: string, o: { depositId: string; amount: number; intent: string }) => ({
  id, object: "event", type: "charge.refunded", created: Math.floor(Date.now() / 1000),
  data: { object: { id: `ch_${id}`, object: "charge", amount: o.amount, amount_refunded: o.amount, refunded: true, currency: "cad", payment_intent: o.intent, metadata: { depositId: o.depositId }, refunds: { object: "list", data: [{ id: `re_${id}` }] } } },
});

async function outboxKinds(appointmentId: string) {
  const rows = await sequelize.query<{ kind: string }>(`SELECT kind FROM mail_outbox WHERE appointment_id = $1 AND kind LIKE 'deposit_%' ORDER BY created_at`, { bind: [appointmentId], type: QueryTypes.SELECT });
  return rows.map((r) => r.kind);
}
const auditCount = (subjectId: string, action: string) => AuditEvent.count({ where: { subjectId, action } });

describe("deposit at booking", () => {
  it("asks the clinic's fixed deposit in the booking's transaction and shows it on the visit", async () => {
    const { actor, visit } = await bookOne();
    const deposit = await depositOf(visit.id);
    expect(deposit).toMatchObject({ amountCents: 20_000, currency: "CAD", status: "due" });
    expect(await auditCount(visit.id, "deposit.asked")).toBe(1);
    setSessionUser(actor.user);
    const res = await visitRoute(new NextRequest(`http://localhost/api/appointments/${visit.id}`), { params: Promise.resolve({ id: visit.id }) });
    const body = await res.json();
    expect(res.status).toBe(200);
    expect(body.deposit).toEqual({ amountCents: 20_000, currency: "CAD", status: "due" });
    expect(body.feeCents).toBe(120_000);
    expect(body.balanceDueCents).toBe(120_000);
  });

  it("hides someone else's visit behind a 404", async () => {
    const { visit } = await bookOne();
    const stranger = await createTestPatient(t.clinic.id);
    setSessionUser(asUser(stranger.user));
    const res = await visitRoute(new NextRequest(`http://localhost/api/appointments/${visit.id}`), { params: Promise.resolve({ id: visit.id }) });
    expect(res.status).toBe(404);
  });
});

describe("webhook", () => {
  it("refuses a forged signature with 400 and changes nothing", async () => {
    const { visit } = await bookOne();
    const deposit = (await depositOf(visit.id))!;
    const event = completedEvent("evt_forged_1", { depositId: deposit.id, amount: 20_000, intent: "pi_forged_1" });
    const forged = await deliver(event, signed(JSON.stringify(event), "whsec_not_the_clinics_secret_123"));
    expect(forged.status).toBe(400);
    const unsigned = await deliver(event, "t=1,v1=00");
    expect(unsigned.status).toBe(400);
    expect((await depositOf(visit.id))!.status).toBe("due");
    expect(await sequelize.query(`SELECT 1 FROM payment_events WHERE event_id = 'evt_forged_1'`, { type: QueryTypes.SELECT })).toHaveLength(0);
  });

  it("marks the deposit paid once; a replayed event is a 200 no-op", async () => {
    const { visit } = await bookOne();
    const deposit = (await depositOf(visit.id))!;
    const event = completedEvent(`evt_pay_${deposit.id.slice(0, 8)}`, { depositId: deposit.id, amount: 20_000, intent: `pi_${deposit.id.slice(0, 8)}` });
    const first = await deliver(event);
    expect(first).toEqual({ status: 200, body: { received: true, outcome: "handled" } });
    const paid = (await depositOf(visit.id))!;
    expect(paid.status).toBe("paid");
    expect(paid.paidAt).not.toBeNull();
    const again = await deliver(event);
    expect(again).toEqual({ status: 200, body: { received: true, outcome: "duplicate" } });
    expect(await outboxKinds(visit.id)).toEqual(["deposit_paid"]);
    expect(await auditCount(visit.id, "deposit.paid")).toBe(1);

    // The PDF receipt, read back by an independent parser (pdfjs-dist); the amount as Intl formats CAD in en-CA.
    setSessionUser(asUser(t.staff.reception));
    const res = await receiptRoute(new NextRequest(`http://localhost/api/appointments/${visit.id}/receipt`), { params: Promise.resolve({ id: visit.id }) });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    const text = await pdfText(new Uint8Array(await res.arrayBuffer()));
    expect(text).toContain("Deposit receipt");
    expect(text).toContain("$200.00");
  });

  it("has no receipt before a payment (404)", async () => {
    const { actor, visit } = await bookOne();
    setSessionUser(actor.user);
    const res = await receiptRoute(new NextRequest(`http://localhost/api/appointments/${visit.id}/receipt`), { params: Promise.resolve({ id: visit.id }) });
    expect(res.status).toBe(404);
  });

  it("ignores a session whose amount is not the deposit's", async () => {
    const { visit } = await bookOne();
    const deposit = (await depositOf(visit.id))!;
    const r = await deliver(completedEvent(`evt_cheap_${deposit.id.slice(0, 8)}`, { depositId: deposit.id, amount: 100, intent: "pi_cheap" }));
    expect(r.body.outcome).toBe("ignored");
    expect((await depositOf(visit.id))!.status).toBe("due");
  });

  it("handles a refund that arrives before the payment: refunded stays refunded, each receipt once", async () => {
    const { visit } = await bookOne();
    const deposit = (await depositOf(visit.id))!;
    const tag = deposit.id.slice(0, 8);
    const intent = `pi_ooo_${tag}`;
    expect((await deliver(refundedEvent(`evt_ref_${tag}`, { depositId: deposit.id, amount: 20_000, intent }))).body.outcome).toBe("handled");
    expect((await depositOf(visit.id))!.status).toBe("refunded");
    expect((await deliver(completedEvent(`evt_paid_${tag}`, { depositId: deposit.id, amount: 20_000, intent }))).body.outcome).toBe("handled");
    const after = (await depositOf(visit.id))!;
    expect(after.status).toBe("refunded");
    expect(after.paidAt).not.toBeNull();
    expect((await outboxKinds(visit.id)).sort()).toEqual(["deposit_paid", "deposit_refunded"]);
  });
});

describe("paying on the fake's page and refunds through the SDK", () => {
  async function payOnPage(url: string, card: string) {
    return fetch(url, { method: "POST", body: new URLSearchParams({ card }), redirect: "manual" });
  }

  it("a declined card leaves the deposit due with a clear message; 4242… pays; declining the visit refunds in full", async () => {
    const { actor, visit } = await bookOne();
    const { checkoutUrl } = await startCheckout(actor, visit.id);
    expect(checkoutUrl).toMatch(new RegExp(`^${process.env.STRIPE_API_URL}/pay/cs_test_`));
    // A second click reuses the open page rather than making another session.
    expect((await startCheckout(actor, visit.id)).checkoutUrl).toBe(checkoutUrl);

    const page = await (await fetch(checkoutUrl)).text();
    expect(page).toContain("Card number");
    expect(page).toContain("Pay 200.00 CAD");

    const declined = await payOnPage(checkoutUrl, "4000 0000 0000 0002");
    expect(declined.status).toBe(402);
    expect(await declined.text()).toContain("Your card was declined");
    expect((await depositOf(visit.id))!.status).toBe("due");

    const ok = await payOnPage(checkoutUrl, "4242 4242 4242 4242");
    expect(ok.status).toBe(303);
    expect(ok.headers.get("location")).toContain(`/patient/visits/${visit.id}?deposit=returned`);
    // The app is not running in this test, so hand the webhook over as the fake would, built from the fake's session.
    const deposit = (await depositOf(visit.id))!;
    const session = await sdk.checkout.sessions.retrieve(deposit.checkoutSessionId!);
    expect(session).toMatchObject({ status: "complete", payment_status: "paid", amount_total: 20_000, currency: "cad" });
    const handled = await deliver({ id: `evt_live_${deposit.id.slice(0, 8)}`, object: "event", type: "checkout.session.completed", created: Math.floor(Date.now() / 1000), data: { object: session } });
    expect(handled.body.outcome).toBe("handled");
    expect((await depositOf(visit.id))!.status).toBe("paid");

    const reception = { user: asUser(t.staff.reception) };
    await declineVisit(reception, visit.id, "The mill is being serviced that day.");
    const refunded = (await depositOf(visit.id))!;
    expect(refunded.status).toBe("refunded");
    expect(refunded.refundId).toMatch(/^re_/);
    expect((await outboxKinds(visit.id)).sort()).toEqual(["deposit_paid", "deposit_refunded"]);
    expect(await auditCount(visit.id, "deposit.refunded")).toBe(1);
    // The fake refuses a second refund of the same charge: nothing is refunded twice.
    await expect(sdk.refunds.create({ payment_intent: refunded.paymentIntentId! })).rejects.toThrow(/more than what is left/);
  });

  it("keeps the deposit when the patient cancels after the refund cut-off, refunds it before", async () => {
    const late = await bookOne();
    const early = await bookOne();
    for (const b of [late, early]) {
      const d = (await depositOf(b.visit.id))!;
      const { checkoutUrl } = await startCheckout(b.actor, b.visit.id);
      await payOnPage(checkoutUrl, "4242424242424242");
      const session = await sdk.checkout.sessions.retrieve((await depositOf(b.visit.id))!.checkoutSessionId!);
      await deliver({ id: `evt_c_${d.id.slice(0, 8)}`, object: "event", type: "checkout.session.completed", created: Math.floor(Date.now() / 1000), data: { object: session } });
    }
    // 30 hours before the visit: inside the clinic's 24-hour change window, past the 48-hour refund cut-off.
    await cancelVisit(late.actor, late.visit.id, undefined, new Date(late.visit.startsAt.getTime() - 30 * 3_600_000));
    expect((await depositOf(late.visit.id))!.status).toBe("paid");
    expect(await auditCount(late.visit.id, "deposit.kept")).toBe(1);
    await cancelVisit(early.actor, early.visit.id, undefined, new Date(early.visit.startsAt.getTime() - 72 * 3_600_000));
    expect((await depositOf(early.visit.id))!.status).toBe("refunded");
  });
});

describe("unpaid holds", () => {
  it("are released after 30 minutes and the time is offered again", async () => {
    const { visit, proposal } = await bookOne();
    const released = () => releaseUnpaidHolds({ now: new Date(Date.now() + 29 * 60_000), clinicId: t.clinic.id });
    expect(await released()).toBe(0);
    expect(await releaseUnpaidHolds({ now: new Date(Date.now() + 31 * 60_000), clinicId: t.clinic.id })).toBeGreaterThanOrEqual(1);
    expect((await depositOf(visit.id))!.status).toBe("released");
    await visit.reload();
    expect(visit.status).toBe("cancelled");
    expect(await Reservation.count({ where: { appointmentId: visit.id, active: true } })).toBe(0);
    const outbox = await sequelize.query<{ kind: string }>(`SELECT kind FROM mail_outbox WHERE appointment_id = $1 AND kind = 'visit_cancelled'`, { bind: [visit.id], type: QueryTypes.SELECT });
    expect(outbox).toHaveLength(1);
    const day = visit.startsAt.toISOString().slice(0, 10);
    const { slots } = await searchSlots({ proposal, materialId: visit.materialId, mode: visit.mode, from: day, days: 1, now });
    expect(slots.some((s) => s.start.getTime() === visit.startsAt.getTime())).toBe(true);
  });
});

describe("payments list", () => {
  it("lists the clinic's deposits with totals, and as CSV", async () => {
    setSessionUser(asUser(t.staff.reception));
    const res = await paymentsRoute(new NextRequest("http://localhost/api/payments?status=refunded"), undefined);
    const body = await res.json();
    expect(res.status).toBe(200);
    expect(body.payments.length).toBeGreaterThan(0);
    expect(body.payments.every((p: { status: string }) => p.status === "refunded")).toBe(true);
    expect(body.totals.refunded).toBe(body.payments.length * 20_000);
    const csv = await paymentsRoute(new NextRequest("http://localhost/api/payments?format=csv"), undefined);
    expect(csv.headers.get("content-type")).toContain("text/csv");
    const text = await csv.text();
    expect(text.split("\r\n")[0]).toBe("deposit_id,visit_id,patient,visit_starts_at,amount,currency,status,paid_at,refunded_at,created_at");
    expect(text).toContain(",200.00,CAD,");
    setSessionUser(null);
    expect((await paymentsRoute(new NextRequest("http://localhost/api/payments"), undefined)).status).toBe(401);
    const patient = await createTestPatient(t.clinic.id);
    setSessionUser(asUser(patient.user));
    expect((await paymentsRoute(new NextRequest("http://localhost/api/payments"), undefined)).status).toBe(403);
  });
});

describe("fees per material", () => {
  it("start at the clinic's list price, the dentist may change one, and the visit keeps the chosen material's fee", async () => {
    const zr = t.materialByKey["zirconia"].id;
    const ld = t.materialByKey["lithium-disilicate"].id;
    await Material.update({ listFeeCents: 145_000 }, { where: { id: zr } });
    const { user, patient } = await createTestPatient(t.clinic.id);
    const input = proposalSchema.parse({ patientId: patient.id, tooth: "36", fee: "1200", options: [{ materialId: zr, modes: ["standard"] }, { materialId: ld, modes: ["standard"], fee: "1600.50" }] });
    const proposal = await createProposal({ user: asUser(t.staff.dentist), input });
    const options = await ProposalMaterial.findAll({ where: { proposalId: proposal.id } });
    expect(Object.fromEntries(options.map((o) => [o.materialId, o.feeCents]))).toEqual({ [zr]: 145_000, [ld]: 160_050 });
    const visit = await bookVisit({ proposalId: proposal.id, materialId: ld, mode: "standard", start: nextStart(), actor: { user: asUser(user) }, now });
    expect(visit.feeCents).toBe(160_050);
  });
});

describe("dental-plan estimate", () => {
  it("the patient saves their figures; the visit shows the estimated shares; others get 404", async () => {
    const { actor, visit, proposal } = await bookOne();
    const put = (body: unknown) => planRoute(new NextRequest(`http://localhost/api/proposals/${proposal.id}/plan-estimate`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify(body) }), { params: Promise.resolve({ id: proposal.id }) });
    setSessionUser(actor.user);
    const bad = await put({ coveragePercent: 150, deductibleRemaining: "0", annualMaxRemaining: "0" });
    expect(bad.status).toBe(400);
    expect((await bad.json()).field).toBe("coveragePercent");
    expect((await put({ coveragePercent: 50, deductibleRemaining: "50", annualMaxRemaining: "1500" })).status).toBe(200);
    const res = await visitRoute(new NextRequest(`http://localhost/api/appointments/${visit.id}`), { params: Promise.resolve({ id: visit.id }) });
    const body = await res.json();
    // [C] common practice of dental-plan arithmetic, computed by hand: (120 000 − 5 000) × 0.50 = 57 500 ¢ plan; 62 500 ¢ patient.
    expect(body).toMatchObject({ feeCents: 120_000, planShareEstimateCents: 57_500, patientShareCents: 62_500, balanceDueCents: 62_500 });
    expect(await auditCount(proposal.id, "plan_estimate.saved")).toBe(1);
    const stranger = await createTestPatient(t.clinic.id);
    setSessionUser(asUser(stranger.user));
    expect((await put({ coveragePercent: 10, deductibleRemaining: "0", annualMaxRemaining: "0" })).status).toBe(404);
  });
});

// Payments routes: the refusals the route × role matrix (one row per method) does not reach.
const { POST: depositRoute } = await import("@/app/api/appointments/[id]/deposit/route");
const { POST: waiveRoute } = await import("@/app/api/appointments/[id]/deposit/waive/route");
describe("payments routes refuse bad input and wrong states with 4xx", () => {
  const post = (handler: typeof depositRoute, path: string, id: string, body?: unknown) =>
    handler(
      new NextRequest(`http://localhost${path}`, { method: "POST", ...(body === undefined ? {} : { body: JSON.stringify(body), headers: { "content-type": "application/json" } }) }),
      { params: Promise.resolve({ id }) },
    );

  it("a path id that is not a UUID is a 400 naming id, before any lookup", async () => {
    setSessionUser(asUser(t.staff.reception));
    for (const id of ["-".repeat(36), "9".repeat(36), "not-a-visit"]) {
      const res = await visitRoute(new NextRequest(`http://localhost/api/appointments/${id}`), { params: Promise.resolve({ id }) });
      expect(res.status, id).toBe(400);
      expect((await res.json()).field, id).toBe("id");
      const receipt = await receiptRoute(new NextRequest(`http://localhost/api/appointments/${id}/receipt`), { params: Promise.resolve({ id }) });
      expect(receipt.status, id).toBe(400);
    }
  });

  it("an impossible day in the payments list's query is a 400 naming it", async () => {
    setSessionUser(asUser(t.staff.admin));
    // [C] common practice, no source: February 2027 has 28 days, and there is no month 13.
    for (const [query, field] of [["from=2027-02-30", "from"], ["to=2099-13-45", "to"], ["status=lost", "status"], ["format=xlsx", "format"]]) {
      const res = await paymentsRoute(new NextRequest(`http://localhost/api/payments?${query}`), undefined);
      expect(res.status, query).toBe(400);
      expect((await res.json()).field, query).toBe(field);
    }
    expect((await paymentsRoute(new NextRequest("http://localhost/api/payments?from=2027-02-28&to=2027-03-31"), undefined)).status).toBe(200);
  });

  it("waiving twice, or paying a waived deposit, is a 409; a visit without a deposit is a 409, not a 404", async () => {
    const { visit } = await bookOne();
    setSessionUser(asUser(t.staff.reception));
    const path = `/api/appointments/${visit.id}/deposit/waive`;
    expect((await post(waiveRoute, path, visit.id, { reason: "x" })).status).toBe(400);
    expect((await depositOf(visit.id))!.status).toBe("due");
    const first = await post(waiveRoute, path, visit.id, { reason: "Agreed with the clinic manager" });
    expect(first.status).toBe(200);
    expect(await first.json()).toEqual({ amountCents: 20_000, currency: "CAD", status: "waived" });
    expect((await post(waiveRoute, path, visit.id, { reason: "Again" })).status).toBe(409);
    expect((await post(depositRoute, `/api/appointments/${visit.id}/deposit`, visit.id)).status).toBe(409);
    expect(await auditCount(visit.id, "deposit.waived")).toBe(1);

    // A visit booked before the clinic asked deposits has none.
    const { visit: plain } = await bookOne();
    await sequelize.query(`DELETE FROM deposits WHERE appointment_id = $1`, { bind: [plain.id] });
    const none = await post(waiveRoute, `/api/appointments/${plain.id}/deposit/waive`, plain.id, { reason: "Agreed with the clinic manager" });
    expect(none.status).toBe(409);
    expect((await none.json()).error).toMatch(/no deposit/);
    expect((await post(depositRoute, `/api/appointments/${plain.id}/deposit`, plain.id)).status).toBe(409);
  });
});
