// The "out of service" form, shared by the browser form and the server: times are clinic-local
// wall-clock times as a datetime-local field gives them (YYYY-MM-DDTHH:MM).
import { z } from "zod";
import { idSchema, localDateTimeSchema } from "./input";

const localDateTime = (what: string) => localDateTimeSchema(what);

export const outageSchema = z
  .object({
    equipmentId: z.string().min(1, { message: "Choose the chair, mill or furnace." }).pipe(idSchema("The chair, mill or furnace")),
    start: localDateTime("start"),
    end: localDateTime("end"),
    reason: z.string().trim().max(200, { message: "Keep the reason under 200 characters." }).optional(),
  })
  .refine((v) => v.end > v.start, { message: "The out-of-service range must end after it starts.", path: ["end"] });

export type OutageInput = z.infer<typeof outageSchema>;
