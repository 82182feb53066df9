// zod schemas for the money forms, shared by the browser and the server. Amounts typed by people
// are dollars-and-cents strings turned into integer cents here; nothing is trusted as a float.
import { z } from "zod";
import { calendarDateSchema } from "./input";

/** "1,234.50" / "1234.5" / "200" → 123450 / 123450 / 20000 cents. */
export const centsFromText = (what: string) =>
  z
    .union([z.string(), z.number()], { message: `Enter ${what}.` })
    .transform((v) => String(v).trim().replace(/[,\s$]/g, ""))
    .refine((s) => /^\d{1,7}(\.\d{1,2})?$/.test(s), { message: `Enter ${what} as an amount like 200 or 200.50.` })
    .transform((s) => {
      const [whole, frac = ""] = s.split(".");
      return Number(whole) * 100 + Number(frac.padEnd(2, "0"));
    });

export const planEstimateSchema = z.object({
  coveragePercent: z.coerce.number<number>({ message: "Enter the coverage as a percentage." }).int({ message: "Enter the coverage as a whole percentage." }).min(0, { message: "Coverage is between 0 and 100 %." }).max(100, { message: "Coverage is between 0 and 100 %." }),
  deductibleRemaining: centsFromText("the deductible remaining"),
  annualMaxRemaining: centsFromText("the annual maximum remaining"),
  preauthReference: z.string().trim().max(60, { message: "Keep the reference under 60 characters." }).optional().transform((s) => s || null),
});
export type PlanEstimateInput = z.input<typeof planEstimateSchema>;

export const DESK_METHODS = ["card", "debit", "cash", "cheque", "transfer", "plan"] as const;
export const DESK_METHOD_WORDS: Record<(typeof DESK_METHODS)[number], string> = {
  card: "Credit card at the desk",
  debit: "Debit card",
  cash: "Cash",
  cheque: "Cheque",
  transfer: "Bank transfer",
  plan: "Paid by the dental plan",
};

export const deskPaymentSchema = z.object({
  method: z.enum(DESK_METHODS, { message: "Choose how it was paid." }),
  amount: centsFromText("the amount").refine((c) => c > 0, { message: "The amount must be more than zero." }),
  reference: z.string().trim().max(80, { message: "Keep the reference under 80 characters." }).optional().transform((s) => s || null),
});

export const waiveSchema = z.object({ reason: z.string({ message: "Say why the deposit is waived." }).trim().min(3, { message: "Say why the deposit is waived (a few words)." }).max(300) });

export const depositPolicySchema = z
  .object({
    kind: z.enum(["none", "fixed", "percent"], { message: "Choose a deposit policy." }),
    fixedAmount: centsFromText("the deposit amount").optional(),
    percent: z.coerce.number<number>().int().min(1, { message: "Use 1–100 %." }).max(100, { message: "Use 1–100 %." }).optional(),
    refundHours: z.coerce.number<number>({ message: "Enter the refund cut-off in hours." }).int().min(0).max(720, { message: "Keep the cut-off at 30 days or less." }),
  })
  .refine((v) => v.kind !== "fixed" || (v.fixedAmount ?? 0) > 0, { message: "Enter the deposit amount.", path: ["fixedAmount"] })
  .refine((v) => v.kind !== "percent" || v.percent !== undefined, { message: "Enter the percentage.", path: ["percent"] })
  .transform((v) => ({ kind: v.kind, value: v.kind === "fixed" ? v.fixedAmount! : v.kind === "percent" ? v.percent! : 0, refundHours: v.refundHours }));

export const paymentsQuerySchema = z.object({
  status: z.enum(["due", "paid", "refunded", "waived", "released"], { message: "Unknown status." }).optional(),
  // Real calendar days only: 2027-02-30 is refused here rather than by the database.
  from: calendarDateSchema("from").optional(),
  to: calendarDateSchema("to").optional(),
  format: z.enum(["json", "csv"], { message: "format is json or csv." }).optional(),
});
