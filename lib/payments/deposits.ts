// Deposits for booked visits: asked at booking (in the booking's transaction), paid through the
// payment service's hosted page, refunded through its SDK, waived by reception, or let go when an
// unpaid booking's hold on the chair, mill and furnace runs out. Every change is audited in the
// transaction that makes it; the e-mail receipts go through the mail outbox in that transaction too.
import "server-only";
import { QueryTypes, type Transaction } from "sequelize";
import { Appointment, Clinic, sequelize } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { assertCanSee } from "@/lib/data/access";
import { depositFor, depositRefundable, estimatePlanShare, type DepositPolicy } from "@/lib/domain/money";
import { env } from "@/lib/env";
import { enqueueMail } from "@/lib/mail/outbox";
import { recordAudit } from "@/lib/server/audit";
import { AppError, conflict, forbidden } from "@/lib/server/errors";
import { payments } from "./client";

export type DepositRow = {
  id: string;
  clinicId: string;
  appointmentId: string;
  amountCents: number;
  currency: string;
  status: "due" | "paid" | "refunded" | "waived" | "released";
  checkoutSessionId: string | null;
  paymentIntentId: string | null;
  refundId: string | null;
  paidAt: Date | null;
  refundedAt: Date | null;
  closedReason: string | null;
  createdAt: Date;
};

type Actor = { user: SessionUser; ip?: string; userAgent?: string };
type Tx = Transaction | undefined;

const COLUMNS = `id, clinic_id AS "clinicId", appointment_id AS "appointmentId", amount_cents AS "amountCents", currency, status,
  checkout_session_id AS "checkoutSessionId", payment_intent_id AS "paymentIntentId", refund_id AS "refundId",
  paid_at AS "paidAt", refunded_at AS "refundedAt", closed_reason AS "closedReason", created_at AS "createdAt"`;

export async function depositOf(appointmentId: string, opts: { transaction?: Tx; lock?: boolean } = {}): Promise<DepositRow | null> {
  const [row] = await sequelize.query<DepositRow>(`SELECT ${COLUMNS} FROM deposits WHERE appointment_id = $1${opts.lock ? " FOR UPDATE" : ""}`, {
    bind: [appointmentId], transaction: opts.transaction, type: QueryTypes.SELECT,
  });
  return row ?? null;
}

export async function depositById(id: string, opts: { transaction?: Tx; lock?: boolean } = {}): Promise<DepositRow | null> {
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  const [row] = await sequelize.query<DepositRow>(`SELECT ${COLUMNS} FROM deposits WHERE id = $1${opts.lock ? " FOR UPDATE" : ""}`, {
    bind: [id], transaction: opts.transaction, type: QueryTypes.SELECT,
  });
  return row ?? null;
}

export function policyOf(clinic: Pick<Clinic, "depositKind" | "depositValue" | "depositRefundHours">): DepositPolicy {
  return { kind: clinic.depositKind, value: clinic.depositValue, refundHours: clinic.depositRefundHours };
}

/** The patient's share of a fee after the proposal's plan estimate, if one was entered. */
export async function patientShareFor(proposalId: string, feeCents: number, transaction?: Tx): Promise<{ planShareCents: number | null; patientShareCents: number }> {
  const [est] = await sequelize.query<{ coverage: number; deductible: number; max: number }>(
    `SELECT coverage_percent AS coverage, deductible_remaining_cents AS deductible, annual_max_remaining_cents AS max FROM plan_estimates WHERE proposal_id = $1`,
    { bind: [proposalId], transaction, type: QueryTypes.SELECT },
  );
  if (!est) return { planShareCents: null, patientShareCents: feeCents };
  const e = estimatePlanShare({ feeCents, coveragePercent: est.coverage, deductibleRemainingCents: est.deductible, annualMaxRemainingCents: est.max });
  return { planShareCents: e.planShareCents, patientShareCents: e.patientShareCents };
}

/** Called inside the booking transaction: asks the clinic's deposit, if any, for the new visit. */
export async function askDeposit(appointment: Appointment, clinic: Clinic, actorUserId: string, transaction: Transaction): Promise<DepositRow | null> {
  const { patientShareCents } = await patientShareFor(appointment.proposalId, appointment.feeCents, transaction);
  const amount = depositFor(policyOf(clinic), patientShareCents);
  if (amount <= 0) return null;
  const [row] = await sequelize.query<DepositRow>(
    `INSERT INTO deposits (clinic_id, appointment_id, amount_cents, currency) VALUES ($1, $2, $3, $4) RETURNING ${COLUMNS}`,
    { bind: [clinic.id, appointment.id, amount, clinic.currency], transaction, type: QueryTypes.SELECT },
  );
  await recordAudit({ clinicId: clinic.id, actorUserId, action: "deposit.asked", subjectType: "appointment", subjectId: appointment.id, data: { depositId: row.id, amountCents: amount, currency: clinic.currency } }, transaction);
  return row;
}

async function setDeposit(id: string, fields: Record<string, unknown>, transaction: Transaction) {
  const names = Object.keys(fields);
  const sets = names.map((n, i) => `${n} = $${i + 2}`).join(", ");
  await sequelize.query(`UPDATE deposits SET ${sets}, updated_at = now() WHERE id = $1`, { bind: [id, ...names.map((n) => fields[n])], transaction });
}

function receipt(deposit: DepositRow, visitStartsAt: Date, kind: "deposit_paid" | "deposit_refunded", data: Record<string, unknown>) {
  // The key names the deposit, so a replayed event or a second path can never queue a second receipt.
  return { clinicId: deposit.clinicId, appointmentId: deposit.appointmentId, kind, visitStartsAt, keyKind: `${kind}:${deposit.id}`, data: { depositId: deposit.id, amountCents: deposit.amountCents, currency: deposit.currency, ...data } };
}

async function visitStart(appointmentId: string, transaction: Transaction): Promise<Date> {
  const visit = await Appointment.findByPk(appointmentId, { attributes: ["startsAt"], transaction });
  return visit!.startsAt;
}

/** Marks a deposit paid (idempotent; a refund that arrived first keeps the deposit refunded). */
export async function markPaid(deposit: DepositRow, paymentIntentId: string | null, paidAt: Date, source: string, transaction: Transaction): Promise<"paid" | "already" | "late"> {
  if (deposit.paidAt || deposit.status === "paid") return "already";
  const late = deposit.status === "released" || deposit.status === "waived";
  await setDeposit(deposit.id, { status: deposit.status === "refunded" ? "refunded" : "paid", paid_at: paidAt, payment_intent_id: paymentIntentId ?? deposit.paymentIntentId }, transaction);
  await recordAudit({ clinicId: deposit.clinicId, actorUserId: null, action: "deposit.paid", subjectType: "appointment", subjectId: deposit.appointmentId, data: { depositId: deposit.id, amountCents: deposit.amountCents, currency: deposit.currency, source, ...(late ? { after: deposit.status } : {}) } }, transaction);
  await enqueueMail([receipt(deposit, await visitStart(deposit.appointmentId, transaction), "deposit_paid", { paidAt: paidAt.toISOString() })], transaction);
  return late ? "late" : "paid";
}

/** Marks a deposit refunded (idempotent). */
export async function markRefunded(deposit: DepositRow, refundId: string | null, source: string, transaction: Transaction): Promise<boolean> {
  if (deposit.status === "refunded") return false;
  const at = new Date();
  await setDeposit(deposit.id, { status: "refunded", refunded_at: at, refund_id: refundId ?? deposit.refundId }, transaction);
  await recordAudit({ clinicId: deposit.clinicId, actorUserId: null, action: "deposit.refunded", subjectType: "appointment", subjectId: deposit.appointmentId, data: { depositId: deposit.id, amountCents: deposit.amountCents, currency: deposit.currency, source } }, transaction);
  await enqueueMail([receipt(deposit, await visitStart(deposit.appointmentId, transaction), "deposit_refunded", { refundedAt: at.toISOString() })], transaction);
  return true;
}

/** Opens (or reopens) the hosted payment page for a visit's due deposit. Amounts come from the row, never the browser. */
export async function startCheckout(actor: Actor, appointmentId: string): Promise<{ checkoutUrl: string }> {
  if (!["patient", "reception", "admin"].includes(actor.user.role)) throw forbidden("Only the patient or reception can take a deposit.");
  const visit = /^[0-9a-f-]{36}$/i.test(appointmentId) ? await Appointment.findByPk(appointmentId) : null;
  await assertCanSee(actor.user, visit, "That visit");
  if (!["requested", "confirmed"].includes(visit!.status)) throw conflict("This visit is not open, so no deposit can be paid for it.");
  const deposit = await depositOf(visit!.id);
  if (!deposit) throw conflict("This visit has no deposit to pay.");
  if (deposit.status !== "due") throw conflict(deposit.status === "paid" ? "The deposit is already paid." : `The deposit is ${deposit.status}; nothing to pay.`);

  const stripe = payments();
  if (deposit.checkoutSessionId) {
    const open = await stripe.checkout.sessions.retrieve(deposit.checkoutSessionId).catch(() => null);
    if (open?.status === "open" && open.url) return { checkoutUrl: open.url };
  }
  const base = env().APP_URL.replace(/\/$/, "");
  const back = actor.user.role === "patient" ? `${base}/patient/visits/${visit!.id}` : `${base}/clinic/visits/${visit!.id}`;
  const metadata = { depositId: deposit.id, appointmentId: visit!.id };
  const session = await stripe.checkout.sessions
    .create(
      {
        mode: "payment",
        client_reference_id: deposit.id,
        line_items: [{ quantity: 1, price_data: { currency: deposit.currency.toLowerCase(), unit_amount: deposit.amountCents, product_data: { name: "Deposit for a same-day crown visit" } } }],
        metadata,
        payment_intent_data: { metadata },
        success_url: `${back}?deposit=returned`,
        cancel_url: back,
      },
      // One session per deposit and per earlier session: a double click gets the same page.
      { idempotencyKey: `checkout:${deposit.id}:${deposit.checkoutSessionId ?? "first"}` },
    )
    .catch((err: Error) => {
      console.error(`Payment service refused a checkout for deposit ${deposit.id}: ${err.name}`);
      throw new AppError(502, "The payment service is not answering. Please try again in a minute.", { code: "payment_unavailable" });
    });
  await sequelize.transaction(async (transaction) => {
    await setDeposit(deposit.id, { checkout_session_id: session.id }, transaction);
    await recordAudit({ clinicId: deposit.clinicId, actorUserId: actor.user.id, action: "deposit.checkout_opened", subjectType: "appointment", subjectId: visit!.id, ip: actor.ip, userAgent: actor.userAgent, data: { depositId: deposit.id } }, transaction);
  });
  if (!session.url) throw new AppError(502, "The payment service gave no payment page. Please try again.", { code: "payment_unavailable" });
  return { checkoutUrl: session.url };
}

/** Refunds a paid deposit in full through the SDK; the refund is recorded at once and again (as a no-op) by its webhook. */
export async function refundDeposit(depositId: string, reason: string, actorUserId: string | null): Promise<boolean> {
  const deposit = await depositById(depositId);
  if (!deposit || deposit.status === "refunded" || !deposit.paidAt || !deposit.paymentIntentId) return false;
  const refund = await payments().refunds.create(
    { payment_intent: deposit.paymentIntentId, metadata: { depositId: deposit.id, appointmentId: deposit.appointmentId } },
    { idempotencyKey: `refund:${deposit.id}` },
  );
  await sequelize.transaction(async (transaction) => {
    const fresh = (await depositById(deposit.id, { transaction, lock: true }))!;
    if (await markRefunded(fresh, refund.id, "refund", transaction)) {
      await recordAudit({ clinicId: deposit.clinicId, actorUserId, action: "deposit.refund_requested", subjectType: "appointment", subjectId: deposit.appointmentId, data: { depositId: deposit.id, reason } }, transaction);
    }
  });
  return true;
}

/**
 * After a visit ends without taking place: a due deposit is no longer asked; a paid one comes back
 * in full when the clinic declined or cancelled, or when the patient cancelled before the cut-off.
 */
export async function settleDepositAfterEnd(opts: { appointment: Appointment; to: "declined" | "cancelled"; byPatient: boolean; actorUserId: string; now?: Date }) {
  const { appointment, to } = opts;
  const deposit = await depositOf(appointment.id);
  if (!deposit) return;
  if (deposit.status === "due") {
    await sequelize.transaction(async (transaction) => {
      await setDeposit(deposit.id, { status: "released", closed_reason: `The visit was ${to}.` }, transaction);
      await recordAudit({ clinicId: deposit.clinicId, actorUserId: opts.actorUserId, action: "deposit.released", subjectType: "appointment", subjectId: appointment.id, data: { depositId: deposit.id, reason: `visit ${to}` } }, transaction);
    });
    return;
  }
  if (deposit.status !== "paid") return;
  const clinic = (await Clinic.findByPk(appointment.clinicId))!;
  const refundable = !opts.byPatient || depositRefundable(policyOf(clinic), appointment.startsAt, opts.now ?? new Date());
  if (refundable) {
    await refundDeposit(deposit.id, `visit ${to}${opts.byPatient ? " by the patient" : " by the clinic"}`, opts.actorUserId);
  } else {
    await sequelize.transaction(async (transaction) => {
      await recordAudit({ clinicId: deposit.clinicId, actorUserId: opts.actorUserId, action: "deposit.kept", subjectType: "appointment", subjectId: appointment.id, data: { depositId: deposit.id, refundHours: clinic.depositRefundHours } }, transaction);
    });
  }
}

/** Whether a patient cancelling now would get the deposit back: shown before they confirm. */
export async function cancellationDepositNote(appointment: Appointment, now = new Date()): Promise<{ paid: boolean; refundable: boolean; amountCents: number; currency: string; refundHours: number } | null> {
  const deposit = await depositOf(appointment.id);
  if (!deposit || deposit.status !== "paid") return null;
  const clinic = (await Clinic.findByPk(appointment.clinicId))!;
  return { paid: true, refundable: depositRefundable(policyOf(clinic), appointment.startsAt, now), amountCents: deposit.amountCents, currency: deposit.currency, refundHours: clinic.depositRefundHours };
}

export async function waiveDeposit(actor: Actor, appointmentId: string, reason: string) {
  if (!["reception", "admin"].includes(actor.user.role)) throw forbidden("Only reception or the clinic manager can waive a deposit.");
  const visit = /^[0-9a-f-]{36}$/i.test(appointmentId) ? await Appointment.findByPk(appointmentId) : null;
  await assertCanSee(actor.user, visit, "That visit");
  return sequelize.transaction(async (transaction) => {
    const deposit = await depositOf(visit!.id, { transaction, lock: true });
    // The visit is the caller's to see; having no deposit is its state (409), not a missing row.
    if (!deposit) throw conflict("This visit has no deposit to waive.");
    if (deposit.status !== "due") throw conflict(`The deposit is ${deposit.status}, so it cannot be waived.`);
    await setDeposit(deposit.id, { status: "waived", closed_reason: reason }, transaction);
    await recordAudit({ clinicId: deposit.clinicId, actorUserId: actor.user.id, action: "deposit.waived", subjectType: "appointment", subjectId: visit!.id, ip: actor.ip, userAgent: actor.userAgent, data: { depositId: deposit.id, reason } }, transaction);
    return { ...deposit, status: "waived" as const };
  });
}
