import { describe, expect, it } from "vitest";
import { balanceDue, depositFor, depositRefundable, estimatePlanShare } from "@/lib/domain/money";
import { centsFromText, depositPolicySchema, planEstimateSchema } from "@/lib/domain/payment-schemas";

describe("dental-plan estimate", () => {
  it("fee 1 400.00, deductible 50.00 left, 50 % coverage, ample maximum", () => {
    // [C] common practice of dental-plan arithmetic, computed by hand:
    // (140 000 − 5 000) × 0.50 = 67 500 ¢ plan; 140 000 − 67 500 = 72 500 ¢ patient.
    expect(estimatePlanShare({ feeCents: 140_000, coveragePercent: 50, deductibleRemainingCents: 5_000, annualMaxRemainingCents: 150_000 }))
      .toEqual({ feeCents: 140_000, planShareCents: 67_500, patientShareCents: 72_500 });
  });

  it("deductible larger than the fee: the plan pays nothing", () => {
    // [C] common practice of dental-plan arithmetic, computed by hand:
    // max(0, 30 000 − 50 000) = 0, so 0 ¢ plan and the whole 30 000 ¢ for the patient.
    expect(estimatePlanShare({ feeCents: 30_000, coveragePercent: 80, deductibleRemainingCents: 50_000, annualMaxRemainingCents: 100_000 }))
      .toEqual({ feeCents: 30_000, planShareCents: 0, patientShareCents: 30_000 });
  });

  it("annual maximum reached part-way: the plan pays only what is left", () => {
    // [C] common practice of dental-plan arithmetic, computed by hand:
    // (140 000 − 0) × 0.80 = 112 000 ¢, capped at the 40 000 ¢ left → patient 100 000 ¢.
    expect(estimatePlanShare({ feeCents: 140_000, coveragePercent: 80, deductibleRemainingCents: 0, annualMaxRemainingCents: 40_000 }))
      .toEqual({ feeCents: 140_000, planShareCents: 40_000, patientShareCents: 100_000 });
    // [C] computed by hand: maximum already used up (0 ¢ left) → the patient pays it all.
    expect(estimatePlanShare({ feeCents: 140_000, coveragePercent: 80, deductibleRemainingCents: 0, annualMaxRemainingCents: 0 }).patientShareCents).toBe(140_000);
  });

  it("0 % and 100 % coverage", () => {
    // [C] common practice of dental-plan arithmetic, computed by hand: 0 % → plan 0 ¢.
    expect(estimatePlanShare({ feeCents: 125_000, coveragePercent: 0, deductibleRemainingCents: 0, annualMaxRemainingCents: 200_000 }).planShareCents).toBe(0);
    // [C] computed by hand: 100 % after a 10 000 ¢ deductible → plan 115 000 ¢, patient 10 000 ¢.
    expect(estimatePlanShare({ feeCents: 125_000, coveragePercent: 100, deductibleRemainingCents: 10_000, annualMaxRemainingCents: 200_000 }))
      .toEqual({ feeCents: 125_000, planShareCents: 115_000, patientShareCents: 10_000 });
  });

  it("rounds half a cent up, in the patient's favour", () => {
    // [C] common practice of dental-plan arithmetic, computed by hand:
    // 100 001 ¢ × 0.50 = 50 000.5 ¢ → plan 50 001 ¢, patient 50 000 ¢.
    expect(estimatePlanShare({ feeCents: 100_001, coveragePercent: 50, deductibleRemainingCents: 0, annualMaxRemainingCents: 1_000_000 }))
      .toEqual({ feeCents: 100_001, planShareCents: 50_001, patientShareCents: 50_000 });
    // [C] computed by hand: 333 ¢ × 0.15 = 49.95 ¢ → 50 ¢ (nearest cent); 333 ¢ × 0.10 = 33.3 ¢ → 33 ¢.
    expect(estimatePlanShare({ feeCents: 333, coveragePercent: 15, deductibleRemainingCents: 0, annualMaxRemainingCents: 1_000 }).planShareCents).toBe(50);
    expect(estimatePlanShare({ feeCents: 333, coveragePercent: 10, deductibleRemainingCents: 0, annualMaxRemainingCents: 1_000 }).planShareCents).toBe(33);
  });

  it("refuses fractions of a cent and coverage outside 0–100 %", () => {
    expect(() => estimatePlanShare({ feeCents: 10.5, coveragePercent: 50, deductibleRemainingCents: 0, annualMaxRemainingCents: 0 })).toThrow(RangeError);
    expect(() => estimatePlanShare({ feeCents: 100, coveragePercent: 101, deductibleRemainingCents: 0, annualMaxRemainingCents: 0 })).toThrow(RangeError);
    expect(() => estimatePlanShare({ feeCents: 100, coveragePercent: 50, deductibleRemainingCents: -1, annualMaxRemainingCents: 0 })).toThrow(RangeError);
  });
});

describe("deposit", () => {
  it("fixed, percentage and none", () => {
    // [C] computed by hand: a fixed 20 000 ¢ deposit on a 72 500 ¢ share stays 20 000 ¢.
    expect(depositFor({ kind: "fixed", value: 20_000, refundHours: 48 }, 72_500)).toBe(20_000);
    // [C] computed by hand: never more than the patient's share (15 000 ¢).
    expect(depositFor({ kind: "fixed", value: 20_000, refundHours: 48 }, 15_000)).toBe(15_000);
    // [C] computed by hand: 25 % of 72 501 ¢ = 18 125.25 ¢ → 18 125 ¢; 10 % of 72 505 ¢ = 7 250.5 ¢ → 7 251 ¢.
    expect(depositFor({ kind: "percent", value: 25, refundHours: 48 }, 72_501)).toBe(18_125);
    expect(depositFor({ kind: "percent", value: 10, refundHours: 48 }, 72_505)).toBe(7_251);
    expect(depositFor({ kind: "none", value: 20_000, refundHours: 48 }, 72_500)).toBe(0);
  });

  it("is refundable up to the cut-off and kept after it", () => {
    const start = new Date("2026-03-10T15:00:00Z");
    expect(depositRefundable({ refundHours: 48 }, start, new Date("2026-03-08T15:00:00Z"))).toBe(true);
    expect(depositRefundable({ refundHours: 48 }, start, new Date("2026-03-08T15:00:01Z"))).toBe(false);
  });

  it("balance due after deposit and desk payments", () => {
    expect(balanceDue({ patientShareCents: 72_500, depositPaidCents: 20_000, deskPaidCents: 30_000 })).toBe(22_500);
    expect(balanceDue({ patientShareCents: 10_000, depositPaidCents: 20_000, deskPaidCents: 0 })).toBe(0);
  });
});

describe("amounts typed by people", () => {
  it("become integer cents without floating-point steps", () => {
    const amount = centsFromText("the amount");
    expect(amount.parse("200")).toBe(20_000);
    expect(amount.parse("1,234.5")).toBe(123_450);
    // 0.29 × 100 is 28.999… in binary floating point; the text is split instead.
    expect(amount.parse("0.29")).toBe(29);
    expect(amount.safeParse("12.345").success).toBe(false);
    expect(amount.safeParse("-5").success).toBe(false);
  });

  it("parses the deposit policy and the plan figures", () => {
    expect(depositPolicySchema.parse({ kind: "fixed", fixedAmount: "200", refundHours: "48" })).toEqual({ kind: "fixed", value: 20_000, refundHours: 48 });
    expect(depositPolicySchema.parse({ kind: "percent", percent: "25", refundHours: "24" })).toEqual({ kind: "percent", value: 25, refundHours: 24 });
    expect(depositPolicySchema.safeParse({ kind: "fixed", refundHours: "48" }).success).toBe(false);
    expect(planEstimateSchema.parse({ coveragePercent: "50", deductibleRemaining: "50", annualMaxRemaining: "1500" }))
      .toEqual({ coveragePercent: 50, deductibleRemaining: 5_000, annualMaxRemaining: 150_000, preauthReference: null });
    expect(planEstimateSchema.safeParse({ coveragePercent: "120", deductibleRemaining: "0", annualMaxRemaining: "0" }).success).toBe(false);
  });
});
