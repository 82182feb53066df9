// Data access for money: a visit's fee, plan estimate, deposit and balance; the clinic's payments
// table; plan estimates and desk payments. Each function checks who may see or change the row.
import "server-only";
import { QueryTypes } from "sequelize";
import { Clinic, Material, Patient, Proposal, User, sequelize } from "@/db/models";
import type { SessionUser } from "@/lib/auth/session";
import { findVisitFor } from "@/lib/booking/transitions";
import { balanceDue, receiptNumber, type DepositStatus } from "@/lib/domain/money";
import { deskPaymentSchema, planEstimateSchema } from "@/lib/domain/payment-schemas";
import { describeTooth } from "@/lib/domain/tooth";
import { money, when } from "@/lib/format";
import { depositOf, patientShareFor } from "@/lib/payments/deposits";
import { buildReceiptPdf } from "@/lib/payments/receipt-pdf";
import { recordAudit } from "@/lib/server/audit";
import { forbidden, notFound } from "@/lib/server/errors";
import { assertCanSee } from "./access";

type Actor = { user: SessionUser; ip?: string; userAgent?: string };

export type DepositSummary = { amountCents: number; currency: string; status: DepositStatus; paidAt?: string };

export async function depositSummary(appointmentId: string, currency: string): Promise<DepositSummary> {
  const d = await depositOf(appointmentId);
  if (!d) return { amountCents: 0, currency, status: "none" };
  return { amountCents: d.amountCents, currency: d.currency, status: d.status, ...(d.paidAt ? { paidAt: new Date(d.paidAt).toISOString() } : {}) };
}

export type PlanEstimateRow = { coveragePercent: number; deductibleRemainingCents: number; annualMaxRemainingCents: number; preauthReference: string | null; updatedAt: string };

export async function planEstimateOf(proposalId: string): Promise<PlanEstimateRow | null> {
  const [row] = await sequelize.query<PlanEstimateRow>(
    `SELECT coverage_percent AS "coveragePercent", deductible_remaining_cents AS "deductibleRemainingCents",
            annual_max_remaining_cents AS "annualMaxRemainingCents", preauth_reference AS "preauthReference", updated_at AS "updatedAt"
       FROM plan_estimates WHERE proposal_id = $1`,
    { bind: [proposalId], type: QueryTypes.SELECT },
  );
  return row ?? null;
}

/** The visit for the API and pages: fee, the plan estimate, the deposit and what is left to pay. */
export async function getVisitMoney(actor: Actor, id: string) {
  const visit = await findVisitFor(actor, id);
  const clinic = (await Clinic.findByPk(visit.clinicId))!;
  const currency = clinic.currency;
  const [deposit, share, estimate, desk] = await Promise.all([
    depositSummary(visit.id, currency),
    patientShareFor(visit.proposalId, visit.feeCents),
    planEstimateOf(visit.proposalId),
    deskPaymentsOf(visit.id),
  ]);
  const depositPaidCents = deposit.status === "paid" ? deposit.amountCents : 0;
  const deskPaidCents = desk.reduce((n, p) => n + p.amountCents, 0);
  return {
    visit,
    clinic,
    money: {
      feeCents: visit.feeCents,
      currency,
      planShareEstimateCents: share.planShareCents,
      patientShareCents: share.patientShareCents,
      deposit,
      deskPayments: desk,
      balanceDueCents: balanceDue({ patientShareCents: share.patientShareCents, depositPaidCents, deskPaidCents }),
      planEstimate: estimate,
    },
  };
}

export async function deskPaymentsOf(appointmentId: string) {
  return sequelize.query<{ id: string; amountCents: number; currency: string; method: string; reference: string | null; createdAt: string }>(
    `SELECT id, amount_cents AS "amountCents", currency, method, reference, created_at AS "createdAt" FROM desk_payments WHERE appointment_id = $1 ORDER BY created_at`,
    { bind: [appointmentId], type: QueryTypes.SELECT },
  );
}

/** The patient (own proposal) or staff enter the dental-plan figures; audited. */
export async function savePlanEstimate(actor: Actor, proposalId: string, input: unknown) {
  const parsed = planEstimateSchema.parse(input);
  const proposal = /^[0-9a-f-]{36}$/i.test(proposalId) ? await Proposal.findByPk(proposalId) : null;
  await assertCanSee(actor.user, proposal, "That proposal");
  await sequelize.transaction(async (transaction) => {
    await sequelize.query(
      `INSERT INTO plan_estimates (proposal_id, coverage_percent, deductible_remaining_cents, annual_max_remaining_cents, preauth_reference, entered_by)
       VALUES ($1, $2, $3, $4, $5, $6)
       ON CONFLICT (proposal_id) DO UPDATE SET coverage_percent = EXCLUDED.coverage_percent, deductible_remaining_cents = EXCLUDED.deductible_remaining_cents,
         annual_max_remaining_cents = EXCLUDED.annual_max_remaining_cents, preauth_reference = EXCLUDED.preauth_reference, entered_by = EXCLUDED.entered_by, updated_at = now()`,
      { bind: [proposal!.id, parsed.coveragePercent, parsed.deductibleRemaining, parsed.annualMaxRemaining, parsed.preauthReference, actor.user.id], transaction },
    );
    await recordAudit({ clinicId: proposal!.clinicId, actorUserId: actor.user.id, action: "plan_estimate.saved", subjectType: "proposal", subjectId: proposal!.id, ip: actor.ip, userAgent: actor.userAgent, data: { coveragePercent: parsed.coveragePercent } }, transaction);
  });
  return parsed;
}

/** Reception records money taken at the desk for the rest of the fee; audited. */
export async function recordDeskPayment(actor: Actor, appointmentId: string, input: unknown) {
  if (!["reception", "admin"].includes(actor.user.role)) throw forbidden("Only reception or the clinic manager can record a payment.");
  const parsed = deskPaymentSchema.parse(input);
  const visit = await findVisitFor(actor, appointmentId);
  const clinic = (await Clinic.findByPk(visit.clinicId))!;
  return sequelize.transaction(async (transaction) => {
    const [row] = await sequelize.query<{ id: string }>(
      `INSERT INTO desk_payments (clinic_id, appointment_id, amount_cents, currency, method, reference, recorded_by) VALUES ($1, $2, $3, $4, $5, $6, $7) RETURNING id`,
      { bind: [visit.clinicId, visit.id, parsed.amount, clinic.currency, parsed.method, parsed.reference, actor.user.id], transaction, type: QueryTypes.SELECT },
    );
    await recordAudit({ clinicId: visit.clinicId, actorUserId: actor.user.id, action: "payment.desk_recorded", subjectType: "appointment", subjectId: visit.id, ip: actor.ip, userAgent: actor.userAgent, data: { paymentId: row.id, amountCents: parsed.amount, currency: clinic.currency, method: parsed.method } }, transaction);
    return { id: row.id, amountCents: parsed.amount, currency: clinic.currency };
  });
}

export type PaymentListRow = {
  depositId: string;
  appointmentId: string;
  patientName: string | null;
  visitStartsAt: string;
  amountCents: number;
  currency: string;
  status: DepositStatus;
  paidAt: string | null;
  refundedAt: string | null;
  createdAt: string;
};

/** The clinic's deposits, newest first, filtered by status and by booking date (clinic time zone). */
export async function listPayments(opts: { user: SessionUser; status?: string; from?: string; to?: string }) {
  if (opts.user.role === "patient" || !opts.user.clinicId) throw forbidden();
  const clinic = (await Clinic.findByPk(opts.user.clinicId))!;
  const rows = await sequelize.query<PaymentListRow>(
    `SELECT d.id AS "depositId", d.appointment_id AS "appointmentId", u.name AS "patientName", a.starts_at AS "visitStartsAt",
            d.amount_cents AS "amountCents", d.currency, d.status, d.paid_at AS "paidAt", d.refunded_at AS "refundedAt", d.created_at AS "createdAt"
       FROM deposits d
       JOIN appointments a ON a.id = d.appointment_id
       JOIN patients p ON p.id = a.patient_id
       JOIN users u ON u.id = p.user_id
      WHERE d.clinic_id = $1 AND ($2::text IS NULL OR d.status = $2)
        AND ($3::date IS NULL OR (d.created_at AT TIME ZONE $5)::date >= $3::date)
        AND ($4::date IS NULL OR (d.created_at AT TIME ZONE $5)::date <= $4::date)
      ORDER BY d.created_at DESC LIMIT 1000`,
    { bind: [clinic.id, opts.status ?? null, opts.from ?? null, opts.to ?? null, clinic.timeZone], type: QueryTypes.SELECT },
  );
  const totals: Record<string, number> = {};
  for (const r of rows) totals[r.status] = (totals[r.status] ?? 0) + r.amountCents;
  return { currency: clinic.currency, timeZone: clinic.timeZone, rows, totals };
}

/** RFC 4180 CSV; cells that a spreadsheet would run as a formula get a leading apostrophe. */
export function paymentsCsv(rows: PaymentListRow[]): string {
  const cell = (v: unknown) => {
    let s = v == null ? "" : String(v);
    if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
    return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
  };
  const head = ["deposit_id", "visit_id", "patient", "visit_starts_at", "amount", "currency", "status", "paid_at", "refunded_at", "created_at"];
  const lines = rows.map((r) => [r.depositId, r.appointmentId, r.patientName, new Date(r.visitStartsAt).toISOString(), (r.amountCents / 100).toFixed(2), r.currency, r.status, r.paidAt ? new Date(r.paidAt).toISOString() : "", r.refundedAt ? new Date(r.refundedAt).toISOString() : "", new Date(r.createdAt).toISOString()].map(cell).join(","));
  return [head.join(","), ...lines].join("\r\n") + "\r\n";
}

/** Per-material fees for a proposal: the dentist's fee for that material, else the proposal's fee. */
export function feeForOption(option: { feeCents: number | null }, proposalFeeCents: number): number {
  return option.feeCents ?? proposalFeeCents;
}

/** The clinic manager's price list: list fee per active material. */
export async function listPriceList(user: SessionUser) {
  if (user.role !== "admin" || !user.clinicId) throw forbidden("Only the clinic manager edits prices.");
  const clinic = (await Clinic.findByPk(user.clinicId))!;
  const materials = await Material.findAll({ where: { clinicId: user.clinicId, active: true }, order: [["sortOrder", "ASC"]] });
  return { clinic, materials: materials.map((m) => ({ id: m.id, name: m.name, listFeeCents: m.listFeeCents ?? null })) };
}

export async function savePriceList(actor: Actor, prices: { materialId: string; listFeeCents: number | null }[]) {
  if (actor.user.role !== "admin" || !actor.user.clinicId) throw forbidden("Only the clinic manager edits prices.");
  await sequelize.transaction(async (transaction) => {
    for (const p of prices) {
      await Material.update({ listFeeCents: p.listFeeCents }, { where: { id: p.materialId, clinicId: actor.user.clinicId! }, transaction });
    }
    await recordAudit({ clinicId: actor.user.clinicId, actorUserId: actor.user.id, action: "settings.prices_saved", subjectType: "clinic", subjectId: actor.user.clinicId!, ip: actor.ip, userAgent: actor.userAgent, data: { prices } }, transaction);
  });
}

export async function saveDepositPolicy(actor: Actor, policy: { kind: "none" | "fixed" | "percent"; value: number; refundHours: number }) {
  if (actor.user.role !== "admin" || !actor.user.clinicId) throw forbidden("Only the clinic manager edits the deposit policy.");
  await sequelize.transaction(async (transaction) => {
    await Clinic.update({ depositKind: policy.kind, depositValue: policy.value, depositRefundHours: policy.refundHours }, { where: { id: actor.user.clinicId! }, transaction });
    await recordAudit({ clinicId: actor.user.clinicId, actorUserId: actor.user.id, action: "settings.deposit_policy_saved", subjectType: "clinic", subjectId: actor.user.clinicId!, ip: actor.ip, userAgent: actor.userAgent, data: policy }, transaction);
  });
}


/** The PDF receipt for a visit's deposit, once it has been paid (it shows the refund too, if any). */
export async function getDepositReceipt(actor: Actor, id: string) {
  const visit = await findVisitFor(actor, id);
  const deposit = await depositOf(visit.id);
  if (!deposit || !deposit.paidAt) throw notFound("A paid deposit for that visit");
  const [clinic, material, patient] = await Promise.all([
    Clinic.findByPk(visit.clinicId),
    Material.findByPk(visit.materialId),
    Patient.findByPk(visit.patientId, { include: [{ model: User, as: "user", attributes: ["name"] }] }),
  ]);
  const zone = clinic!.timeZone;
  const rows: [string, string][] = [
    ["Deposit paid", money(deposit.amountCents, deposit.currency)],
    ["Paid on", when(deposit.paidAt, zone)],
    ["Paid through", "Online card payment"],
  ];
  if (deposit.status === "refunded") rows.push(["Refunded", `${money(deposit.amountCents, deposit.currency)} on ${deposit.refundedAt ? when(deposit.refundedAt, zone) : "—"}`]);
  rows.push(["Visit fee", money(visit.feeCents, clinic!.currency)]);
  const number = receiptNumber(deposit.id, deposit.status === "refunded" ? "refunded" : "paid");
  const bytes = await buildReceiptPdf({
    clinic: { name: clinic!.name, address: clinic!.address, phone: clinic!.phone },
    patientName: patient?.user?.name ?? "",
    receiptNumber: number,
    visitText: `${when(visit.startsAt, zone)} · ${describeTooth(visit.tooth).words} · ${material?.name ?? ""}`,
    rows,
    issuedAt: new Date(),
  });
  return { bytes, filename: `receipt-${number}.pdf` };
}
