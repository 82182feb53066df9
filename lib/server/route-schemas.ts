// Query and body schemas of the route handlers that have no form of their own; the handlers and
// the published API document (lib/server/openapi.ts) both read them from here.
import { z } from "zod";
import { calendarDateSchema, idSchema } from "@/lib/domain/input";
import { APPOINTMENT_STATUSES } from "@/lib/domain/types";

export const appointmentListQuery = z.object({ status: z.enum(APPOINTMENT_STATUSES, { message: "Unknown status." }).optional() });

export const visitAvailabilityQuery = z.object({
  from: calendarDateSchema("from").optional(),
  days: z.coerce.number<number>().int().min(1, { message: "days must be at least 1." }).max(60, { message: "days can be at most 60." }).optional(),
});

export const boardQuery = z.object({ day: calendarDateSchema("day").optional() });

const LIMIT_MESSAGE = "Limit must be a whole number from 1 to 100.";
export const consentListQuery = z.object({
  status: z.string().max(40).optional(),
  limit: z.coerce.number<number>({ message: LIMIT_MESSAGE }).int({ message: LIMIT_MESSAGE }).min(1, { message: LIMIT_MESSAGE }).max(100, { message: LIMIT_MESSAGE }).optional(),
  cursor: z.string().max(200, { message: "That page link is not valid. Start again from the newest consents." }).optional(),
});

export const consentPdfQuery = z.object({
  version: z.coerce.number<number>({ message: "Version must be a whole number from 1." }).int({ message: "Version must be a whole number from 1." }).min(1, { message: "Version must be a whole number from 1." }).max(10_000).optional(),
});

export const documentListQuery = z.object({ patientId: idSchema("The patient").optional() });

export const documentOpenQuery = z.object({ download: z.enum(["1"]).optional() });

export const reminderJsonBody = z.object({ enabled: z.boolean({ message: "enabled must be true or false." }) });
export const reminderFormBody = z.object({ enabled: z.enum(["true", "false"], { message: "Choose on or off." }) });

/** The multipart fields of an upload, for the API document (the file is checked by lib/documents). */
export const fileUploadBody = z.object({ file: z.string().describe("The file (binary).") });
