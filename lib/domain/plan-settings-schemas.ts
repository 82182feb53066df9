// The clinic manager's visit-plan forms: a material's stage order, furnace programmes, and which
// programme each material and mode fires with. One zod schema per form, shared by browser and server.
import { z } from "zod";
import { STAGE_KEYS } from "./types";

const uuid = z.uuid({ message: "That is not a valid id." });
const optionalId = z.union([uuid, z.literal("")]).transform((v) => v || null);

export const stageOrderSchema = z.object({
  materialId: uuid,
  order: z.array(z.enum(STAGE_KEYS, { error: "That is not a stage." })).min(1).max(STAGE_KEYS.length),
});
export type StageOrderInput = z.input<typeof stageOrderSchema>;

export const furnaceProgrammeSchema = z.object({
  id: z.union([uuid, z.literal("")]).optional().transform((v) => v || undefined),
  name: z.string().trim().min(1, { message: "Give the programme a name staff will recognise." }).max(60, { message: "Keep the name under 60 characters." }),
  minutes: z.coerce.number<number>({ message: "Enter the programme's minutes." }).int({ message: "Use whole minutes." }).min(1, { message: "A programme runs at least 1 minute." }).max(600, { message: "A programme runs at most 600 minutes." }),
  furnaceIds: z.array(uuid).max(20),
});
export type FurnaceProgrammeInput = z.input<typeof furnaceProgrammeSchema>;
export type FurnaceProgrammeValue = z.output<typeof furnaceProgrammeSchema>;

export const firingAssignmentsSchema = z.object({
  modes: z.array(z.object({
    id: z.coerce.number<number>().int().positive(),
    heatProgrammeId: optionalId,
    glazeProgrammeId: optionalId,
    glazeFiringMinutes: z.coerce.number<number>({ message: "Enter minutes." }).int({ message: "Use whole minutes." }).min(0, { message: "Minutes cannot be negative." }).max(240, { message: "At most 240 minutes." }),
  })).max(60),
});
export type FiringAssignmentsInput = z.input<typeof firingAssignmentsSchema>;
export type FiringAssignments = z.output<typeof firingAssignmentsSchema>;
