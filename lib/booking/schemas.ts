// zod schemas for booking requests and staff forms, shared by the browser and the server.
import { z } from "zod";
import { calendarDateSchema, idSchema, instantSchema } from "@/lib/domain/input";
import { isValidFdi } from "@/lib/domain/tooth";
import { MODES } from "@/lib/domain/types";

const uuid = (what: string) => idSchema(what);
const isoWithOffset = instantSchema("start");

export const modeSchema = z.enum(MODES, { message: "mode must be rapid, standard or refined." });

export const bookingSchema = z.object({
  proposalId: uuid("proposalId"),
  materialId: uuid("materialId"),
  mode: modeSchema,
  start: isoWithOffset,
});
export type BookingInput = z.infer<typeof bookingSchema>;

export const availabilityQuerySchema = z.object({
  materialId: uuid("materialId"),
  mode: modeSchema,
  from: calendarDateSchema("from").optional(),
  days: z.coerce.number<number>({ message: "days must be a number." }).int({ message: "days must be a whole number." }).min(1, { message: "days must be at least 1." }).max(60, { message: "days can be at most 60." }).optional(),
});

export const moveSchema = z.object({ start: isoWithOffset });
export const declineSchema = z.object({ reason: z.string({ message: "Give a reason for the patient." }).trim().min(3, { message: "Give a reason for the patient (a few words)." }).max(500, { message: "Keep the reason under 500 characters." }) });
export const cancelSchema = z.object({ reason: z.string().trim().max(500, { message: "Keep the reason under 500 characters." }).optional() });

export const proposalSchema = z.object({
  patientId: uuid("Patient"),
  dentistId: uuid("Dentist").optional(),
  tooth: z.coerce.number<number>({ message: "Enter the tooth as an ISO 3950 code, like 36." }).int().refine(isValidFdi, { message: "Enter a valid ISO 3950 tooth code, like 36 (11–48, or 51–85 for primary teeth)." }),
  fee: z.coerce.number<number>({ message: "Enter the fee." }).min(0, { message: "The fee cannot be negative." }).max(100_000, { message: "That fee looks too high." }),
  note: z.string().trim().max(1000, { message: "Keep the note under 1000 characters." }).optional(),
  options: z.array(z.object({
    materialId: uuid("Material"),
    modes: z.array(modeSchema).min(1, { message: "Allow at least one mode." }),
    // This material's fee; left out, the clinic's list price (or the proposal's fee) applies.
    fee: z.coerce.number<number>({ message: "Enter the material's fee." }).min(0, { message: "A fee cannot be negative." }).max(100_000, { message: "That fee looks too high." }).optional(),
  }))
    .min(1, { message: "Allow at least one material." })
    .max(50, { message: "That is too many materials for one proposal." })
    .refine((options) => new Set(options.map((o) => o.materialId)).size === options.length, { message: "Each material can be listed only once." }),
});
export type ProposalInput = z.infer<typeof proposalSchema>;
