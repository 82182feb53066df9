// The "out of service" form, shared by the browser form and the server: times are clinic-local
// wall-clock times as a datetime-local field gives them (YYYY-MM-DDTHH:MM).
import { z } from "zod";

const localDateTime = (what: string) =>
  z.string({ error: `Enter the ${what} date and time.` }).regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/, { message: `Enter the ${what} as a date and time.` });

export const outageSchema = z
  .object({
    equipmentId: z.string().min(1, { message: "Choose the chair, mill or furnace." }),
    start: localDateTime("start"),
    end: localDateTime("end"),
    reason: z.string().trim().max(200, { message: "Keep the reason under 200 characters." }).optional(),
  })
  .refine((v) => v.end > v.start, { message: "The out-of-service range must end after it starts.", path: ["end"] });

export type OutageInput = z.infer<typeof outageSchema>;
