// Dental-plan estimates and deposits, in integer cents. Pure arithmetic: the server computes every
// amount from stored fees and settings; nothing here trusts a number from the browser.

export type PlanInput = {
  feeCents: number;
  /** Share of major restorative work the plan pays, in whole percent (0–100). */
  coveragePercent: number;
  deductibleRemainingCents: number;
  annualMaxRemainingCents: number;
};

export type PlanEstimate = { feeCents: number; planShareCents: number; patientShareCents: number };

function assertCents(n: number, what: string) {
  if (!Number.isSafeInteger(n) || n < 0) throw new RangeError(`${what} must be a whole, non-negative number of cents.`);
}

/**
 * plan share = min(annual maximum remaining, max(0, fee − deductible remaining) × coverage);
 * patient share = fee − plan share. The product with the coverage is rounded to the nearest cent,
 * a half cent going up (in the patient's favour); integer arithmetic only, so no float drift.
 */
export function estimatePlanShare(input: PlanInput): PlanEstimate {
  const { feeCents, coveragePercent, deductibleRemainingCents, annualMaxRemainingCents } = input;
  assertCents(feeCents, "The fee");
  assertCents(deductibleRemainingCents, "The deductible remaining");
  assertCents(annualMaxRemainingCents, "The annual maximum remaining");
  if (!Number.isInteger(coveragePercent) || coveragePercent < 0 || coveragePercent > 100) {
    throw new RangeError("Coverage must be a whole percent from 0 to 100.");
  }
  const afterDeductible = Math.max(0, feeCents - deductibleRemainingCents);
  // Round half up: floor((x·p + 50) / 100) with x·p exact in integers.
  const covered = Math.floor((afterDeductible * coveragePercent + 50) / 100);
  const planShareCents = Math.min(annualMaxRemainingCents, covered);
  return { feeCents, planShareCents, patientShareCents: feeCents - planShareCents };
}

export type DepositPolicy = { kind: "none" | "fixed" | "percent"; value: number; refundHours: number };

/**
 * The deposit asked at booking: none, a fixed amount, or a whole percentage of the patient's share
 * (rounded half up to the cent). Never more than what the patient will owe.
 */
export function depositFor(policy: DepositPolicy, patientShareCents: number): number {
  assertCents(patientShareCents, "The patient share");
  if (policy.kind === "none") return 0;
  const asked = policy.kind === "fixed" ? policy.value : Math.floor((patientShareCents * policy.value + 50) / 100);
  return Math.max(0, Math.min(asked, patientShareCents));
}

/** A paid deposit comes back in full when the patient cancels at least `refundHours` before the start. */
export function depositRefundable(policy: Pick<DepositPolicy, "refundHours">, startsAt: Date, now: Date): boolean {
  return startsAt.getTime() - now.getTime() >= policy.refundHours * 3_600_000;
}

/** What is left to pay after the deposit and desk payments (a negative balance is shown as zero owed). */
export function balanceDue(opts: { patientShareCents: number; depositPaidCents: number; deskPaidCents: number }): number {
  return Math.max(0, opts.patientShareCents - opts.depositPaidCents - opts.deskPaidCents);
}

export const DEPOSIT_STATUSES = ["none", "due", "paid", "refunded", "waived", "released"] as const;
export type DepositStatus = (typeof DEPOSIT_STATUSES)[number];

export const DEPOSIT_WORDS: Record<DepositStatus, string> = {
  none: "No deposit",
  due: "Deposit due",
  paid: "Deposit paid",
  refunded: "Deposit refunded",
  waived: "Deposit waived by the clinic",
  released: "Not paid in time: the time was released",
};

/** How long an unpaid booking holds the chair, mill and furnace. */
export const UNPAID_HOLD_MINUTES = 30;

/** A short, stable receipt number from the deposit id: "D-1A2B3C4D-P" for a payment, "-R" for its refund. */
export function receiptNumber(depositId: string, kind: "paid" | "refunded"): string {
  return `D-${depositId.replace(/-/g, "").slice(0, 8).toUpperCase()}-${kind === "paid" ? "P" : "R"}`;
}
