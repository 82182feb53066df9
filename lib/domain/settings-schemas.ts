// The clinic manager's settings forms: one zod schema per form, shared by the browser form and the
// server action (which parses again and never trusts the browser's parse).
import { z } from "zod";
import { calendarDateSchema, idSchema } from "./input";
import { clinicSettingsSchema } from "./clinic-settings";

const time = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, { message: "Enter a time as HH:MM." });

export const WEEKDAYS = ["Sunday", "Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday"] as const;

export const openingHoursSchema = z
  .object({
    hours: z
      .array(z.object({ weekday: z.coerce.number<number>().int().min(0).max(6), opens: time, closes: time }))
      .max(28, { message: "At most 28 opening intervals." }),
  })
  .superRefine((value, ctx) => {
    value.hours.forEach((h, i) => {
      if (h.opens >= h.closes) ctx.addIssue({ code: "custom", path: ["hours", i, "closes"], message: "Closing must come after opening." });
    });
    for (let d = 0; d < 7; d++) {
      const day = value.hours.map((h, i) => ({ ...h, i })).filter((h) => h.weekday === d && h.opens < h.closes).sort((a, b) => a.opens.localeCompare(b.opens));
      for (let k = 1; k < day.length; k++) {
        if (day[k].opens < day[k - 1].closes) {
          ctx.addIssue({ code: "custom", path: ["hours", day[k].i, "opens"], message: `This overlaps another ${WEEKDAYS[d]} interval.` });
        }
      }
    }
  });
export type OpeningHoursInput = z.input<typeof openingHoursSchema>;
export type OpeningHours = z.output<typeof openingHoursSchema>;

export const closedDaySchema = z.object({
  day: z.string().min(1, { message: "Choose a date." }).pipe(calendarDateSchema("The day")),
  reason: z.string().trim().max(120, { message: "Keep the reason under 120 characters." }).optional(),
});
export type ClosedDayInput = z.infer<typeof closedDaySchema>;

export const EQUIPMENT_KIND_LABEL = { chair: "Chair", mill: "Mill", furnace: "Furnace" } as const;

export const equipmentSchema = z.object({
  id: idSchema("The equipment").optional(),
  kind: z.enum(["chair", "mill", "furnace"], { error: "Choose chair, mill or furnace." }),
  name: z.string().trim().min(1, { message: "Give it a name staff will recognise." }).max(60, { message: "Keep the name under 60 characters." }),
  active: z.boolean(),
});
export type EquipmentInput = z.infer<typeof equipmentSchema>;

/** Stages whose minutes are clinic-wide (the fabrication side comes per material and mode). */
export const CLINIC_STAGE_KEYS = ["check_in", "anaesthesia", "preparation", "scan", "design", "try_in", "cementation", "aftercare"] as const;

const minutes = (what: string, min = 1) =>
  z.coerce.number<number>({ error: `Enter the ${what} in minutes.` }).int({ message: "Whole minutes only." }).min(min, { message: `The ${what} must be at least ${min} minute${min === 1 ? "" : "s"}.` }).max(480, { message: "Keep it under 8 hours." });

export const stageDurationsSchema = z
  .object({
    rows: z.array(z.object({
      stage: z.enum(CLINIC_STAGE_KEYS, { error: "Choose a stage." }),
      toothClass: z.enum(["", "anterior", "premolar", "molar"]),
      minutes: minutes("duration"),
    })).max(40),
  })
  .superRefine((value, ctx) => {
    const seen = new Set<string>();
    value.rows.forEach((r, i) => {
      const key = `${r.stage}|${r.toothClass}`;
      if (seen.has(key)) ctx.addIssue({ code: "custom", path: ["rows", i, "toothClass"], message: "This stage already has a row for these teeth." });
      seen.add(key);
    });
    for (const stage of CLINIC_STAGE_KEYS) {
      if (!value.rows.some((r) => r.stage === stage && r.toothClass === "")) {
        ctx.addIssue({ code: "custom", path: ["rows"], message: `Every stage needs a row for all teeth; “${stage.replace("_", " ")}” has none.` });
      }
    }
  });
export type StageDurationsInput = z.input<typeof stageDurationsSchema>;
export type StageDurations = z.output<typeof stageDurationsSchema>;

export const materialModesSchema = z.object({
  modes: z.array(z.object({
    id: z.coerce.number<number>().int().positive(),
    fabricationMinutes: minutes("fabrication time"),
    heatTreatmentMinutes: minutes("heat-treatment time", 0),
    finishingMinutes: minutes("finishing time"),
  })).max(60),
});
export type MaterialModesInput = z.input<typeof materialModesSchema>;
export type MaterialModes = z.output<typeof materialModesSchema>;

/** Booking and reminder settings; reminders are typed as a list of hours, e.g. "48, 2". */
export const bookingSettingsSchema = clinicSettingsSchema.extend({
  reminderHoursBefore: z
    .string()
    .trim()
    .regex(/^(\d{1,3}(\s*,\s*\d{1,3})*)?$/, { message: "List hours before the visit separated by commas, e.g. 48, 2." })
    .transform((s) => (s ? [...new Set(s.split(",").map((x) => Number(x.trim())))].sort((a, b) => b - a) : []))
    .pipe(z.array(z.number().int().min(1, { message: "A reminder must be at least 1 hour before." }).max(336, { message: "Reminders go at most 14 days (336 hours) before." })).max(4, { message: "At most four reminders." })),
});
export type BookingSettingsInput = z.input<typeof bookingSettingsSchema>;
export type BookingSettings = z.output<typeof bookingSettingsSchema>;

export const STAFF_ROLE_LABEL = { reception: "Reception", dentist: "Dentist", admin: "Clinic manager" } as const;
const staffRole = z.enum(["reception", "dentist", "admin"], { error: "Choose a role." });

export const newStaffSchema = z.object({
  name: z.string().trim().min(2, { message: "Enter the person's name." }).max(80),
  email: z.email({ message: "Enter a valid e-mail address." }).transform((e) => e.trim().toLowerCase()),
  role: staffRole,
  password: z.string().min(12, { message: "Use at least 12 characters; they can change it later." }).max(128),
});
export type NewStaffInput = z.input<typeof newStaffSchema>;

export const staffUpdateSchema = z.object({ id: idSchema("The staff account"), role: staffRole, active: z.boolean() });

/** The clinic's rule for staff sign-in. */
export const twoFactorRequirementSchema = z.object({ required: z.boolean() });
export type TwoFactorRequirementInput = z.infer<typeof twoFactorRequirementSchema>;

/** `PATCH /api/staff/:id` and the settings form: change who can sign in and with which role. */
export const staffAccessSchema = z
  .object({ active: z.boolean({ error: "active must be true or false." }).optional(), role: staffRole.optional() })
  .strict()
  .refine((v) => v.active !== undefined || v.role !== undefined, { message: "Send active, role or both." });
export type StaffAccessInput = z.infer<typeof staffAccessSchema>;
export type StaffUpdateInput = z.infer<typeof staffUpdateSchema>;
