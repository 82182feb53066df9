// A withdrawal the patient makes by phone, in person or in writing, recorded by staff on their
// behalf: who made it, how it reached the clinic and when (clinic time). One schema for the form and the server.
import { z } from "zod";

export const WITHDRAWAL_CHANNELS = ["phone", "in_person", "in_writing"] as const;
export const WITHDRAWAL_CHANNEL_LABEL: Record<(typeof WITHDRAWAL_CHANNELS)[number] | "online", string> = {
  phone: "by phone",
  in_person: "in person",
  in_writing: "in writing",
  online: "online, in the portal",
};

export const staffWithdrawalSchema = z.object({
  consentId: z.uuid({ message: "That is not a valid consent." }),
  byName: z.string().trim().min(2, { message: "Write who withdrew consent (the patient, or their representative and how they are related)." }).max(120, { message: "Keep this under 120 characters." }),
  via: z.enum(WITHDRAWAL_CHANNELS, { error: "Choose how the withdrawal reached the clinic." }),
  date: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, { message: "Choose the date." }),
  time: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, { message: "Enter the time as HH:MM." }),
  reason: z.string().trim().max(500, { message: "Keep the reason under 500 characters." }).optional(),
});
export type StaffWithdrawalInput = z.input<typeof staffWithdrawalSchema>;
export type StaffWithdrawal = z.output<typeof staffWithdrawalSchema>;
