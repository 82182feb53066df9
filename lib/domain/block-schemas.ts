// What the dentist records for milling (the VITA classical shade and the block size) and the
// "block loaded" mark. One schema per form, shared by the form and the server.
import { z } from "zod";
import { VITA_CLASSICAL_SHADES } from "./shades";

export const visitBlockSchema = z.object({
  appointmentId: z.uuid({ message: "That is not a valid visit." }),
  shade: z.enum(VITA_CLASSICAL_SHADES, { error: "Choose a shade from the VITA classical guide (A1 to D4)." }),
  blockSize: z.string().trim().min(1, { message: "Enter the block size." }).max(20, { message: "Keep the block size under 20 characters." }),
});
export type VisitBlockInput = z.input<typeof visitBlockSchema>;

export const blockLoadedSchema = z.object({
  appointmentId: z.uuid({ message: "That is not a valid visit." }),
  loaded: z.enum(["yes", "no"], { error: "Say whether the block is loaded." }).transform((v) => v === "yes"),
});
