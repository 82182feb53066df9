// The reminder switch on a patient's visit page: one schema for the client and the server action.
import { z } from "zod";

export const reminderToggleSchema = z.object({
  appointmentId: z.uuid({ message: "That visit is not valid." }),
  enabled: z.boolean({ message: "Choose on or off." }),
});

export type ReminderToggleInput = z.infer<typeof reminderToggleSchema>;

export type ReminderToggleResult = { ok: true; enabled: boolean } | { ok: false; error: string };
