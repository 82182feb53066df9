// A clinic's booking and reminder settings with their defaults ([C] common practice, no source).
import { z } from "zod";

export const clinicSettingsSchema = z.object({
  slotMinutes: z.coerce.number<number>().int().refine((n) => [5, 10, 15, 20, 30, 60].includes(n), { message: "Choose a grid of 5, 10, 15, 20, 30 or 60 minutes." }),
  bufferMinutes: z.coerce.number<number>().int().min(0, { message: "The buffer cannot be negative." }).max(60, { message: "Keep the buffer at 60 minutes or less." }),
  minNoticeMinutes: z.coerce.number<number>().int().min(0).max(7 * 24 * 60, { message: "Keep the notice under a week." }),
  cancelCutoffHours: z.coerce.number<number>().int().min(0).max(14 * 24, { message: "Keep the cut-off under two weeks." }),
  reminderHoursBefore: z.array(z.coerce.number<number>().int().min(1).max(14 * 24)).max(4, { message: "At most four reminders." }),
});

export type ClinicSettings = z.infer<typeof clinicSettingsSchema>;

export const DEFAULT_SETTINGS: ClinicSettings = {
  slotMinutes: 15,
  bufferMinutes: 10,
  minNoticeMinutes: 120,
  cancelCutoffHours: 24,
  reminderHoursBefore: [48, 2],
};

export function withDefaults(settings: Partial<ClinicSettings> | null | undefined): ClinicSettings {
  return { ...DEFAULT_SETTINGS, ...(settings ?? {}) };
}

export const DEFAULT_SEARCH_DAYS = 14;
export const MAX_SEARCH_DAYS = 60;
