// A patient's details as staff register and correct them, and as patients change their own:
// one set of zod schemas for the forms and the route handlers, phone numbers in E.164, real dates of birth.
import { getCountryCallingCode, parsePhoneNumberFromString, type CountryCode } from "libphonenumber-js";
import { z } from "zod";

export const LANGUAGES = ["en", "fr"] as const;
export type Language = (typeof LANGUAGES)[number];
export const LANGUAGE_NAMES: Record<Language, string> = { en: "English", fr: "French" };

/** Where no clinic country is set: the demo clinic is in Ontario, Canada. */
export const DEFAULT_COUNTRY: CountryCode = "CA";

// The patient-facing and staff-facing sentences of these forms, kept together for translation.
export const PATIENT_MESSAGES = {
  nameMissing: "Enter the patient's full name.",
  nameTooLong: "Keep the name under 120 characters.",
  nameLetters: "A name needs at least one letter.",
  emailInvalid: "Enter an e-mail address like name@example.com.",
  dobMissing: "Enter the date of birth.",
  dobFormat: "Enter the date of birth as year-month-day, e.g. 1984-03-17.",
  dobNotReal: "That date does not exist in the calendar.",
  dobFuture: "The date of birth cannot be in the future.",
  dobTooOld: "Check the year of birth: it is more than 130 years ago.",
  phoneInvalid: "Enter a mobile number we can text, e.g. 613 555 0134, or with its country code, e.g. +33 6 12 34 56 78.",
  languageInvalid: "Choose English or French.",
  addressTooLong: "Keep the address under 300 characters.",
} as const;

/** A number as typed → E.164 (+ country code + national number, at most 15 digits), or null when not a valid number. */
export function toE164(input: string, country: CountryCode = DEFAULT_COUNTRY): string | null {
  const parsed = parsePhoneNumberFromString(input.trim(), country);
  if (!parsed || !parsed.isValid()) return null;
  // The library accepts some national plans' longest numbers beyond E.164's 15-digit cap; the standard wins.
  return E164_PATTERN.test(parsed.number) ? parsed.number : null;
}

/** ITU-T E.164: "+", a country code not starting with 0, at most 15 digits in all. */
export const E164_PATTERN = /^\+[1-9]\d{1,14}$/;

/** An E.164 number as people of the clinic's country write it: nationally at home, internationally otherwise. */
export function displayPhone(e164: string | null | undefined, country: CountryCode = DEFAULT_COUNTRY): string {
  if (!e164) return "";
  const parsed = parsePhoneNumberFromString(e164);
  if (!parsed) return e164;
  // By calling code, not country: countries sharing one (Canada and the US, Finland and Åland) dial each other nationally.
  return parsed.countryCallingCode === getCountryCallingCode(country) ? parsed.formatNational() : parsed.formatInternational();
}

/** Problem with a YYYY-MM-DD date of birth, or null. `today` is the clinic's local date. */
export function birthDateProblem(value: string, today: string): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value);
  if (!m) return PATIENT_MESSAGES.dobFormat;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  // Date.UTC rolls 2023-02-30 over to March; a real date survives the round trip unchanged.
  const date = new Date(Date.UTC(y, mo - 1, d));
  if (date.getUTCFullYear() !== y || date.getUTCMonth() !== mo - 1 || date.getUTCDate() !== d) return PATIENT_MESSAGES.dobNotReal;
  if (value > today) return PATIENT_MESSAGES.dobFuture;
  if (y < Number(today.slice(0, 4)) - 130) return PATIENT_MESSAGES.dobTooOld;
  return null;
}

/** Today's date (YYYY-MM-DD) in a time zone. */
export function localToday(timeZone: string, now = new Date()): string {
  return new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).format(now);
}

const blankToUndefined = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);

const nameField = z
  .string({ error: PATIENT_MESSAGES.nameMissing })
  .trim()
  .min(1, { error: PATIENT_MESSAGES.nameMissing })
  .max(120, { error: PATIENT_MESSAGES.nameTooLong })
  .refine((v) => /\p{L}/u.test(v), { error: PATIENT_MESSAGES.nameLetters });

export const emailField = z
  .string({ error: PATIENT_MESSAGES.emailInvalid })
  .trim()
  .toLowerCase()
  .max(254, { error: PATIENT_MESSAGES.emailInvalid })
  .pipe(z.email({ error: PATIENT_MESSAGES.emailInvalid }));

function phoneField(country: CountryCode) {
  return z.preprocess(
    blankToUndefined,
    z
      .string({ error: PATIENT_MESSAGES.phoneInvalid })
      .max(40, { error: PATIENT_MESSAGES.phoneInvalid })
      .transform((v, ctx) => {
        const e164 = toE164(v, country);
        if (!e164) {
          ctx.addIssue({ code: "custom", message: PATIENT_MESSAGES.phoneInvalid });
          return z.NEVER;
        }
        return e164;
      })
      .optional(),
  );
}

function birthDateField(today: string) {
  return z
    .string({ error: PATIENT_MESSAGES.dobMissing })
    .trim()
    .min(1, { error: PATIENT_MESSAGES.dobMissing })
    .superRefine((v, ctx) => {
      const problem = birthDateProblem(v, today);
      if (problem) ctx.addIssue({ code: "custom", message: problem });
    });
}

const languageField = z.enum(LANGUAGES, { error: PATIENT_MESSAGES.languageInvalid });
const addressField = z.preprocess(blankToUndefined, z.string().trim().max(300, { error: PATIENT_MESSAGES.addressTooLong }).optional());

export type PatientSchemaContext = { country: CountryCode; today: string };

/** Reception, dentist or clinic manager registering a patient. */
export function registerPatientSchema({ country, today }: PatientSchemaContext) {
  return z.object({
    name: nameField,
    email: emailField,
    dateOfBirth: birthDateField(today),
    phone: phoneField(country),
    language: languageField.default("en"),
    address: addressField,
    reminders: z.boolean().default(true),
  });
}
export type RegisterPatientInput = z.input<ReturnType<typeof registerPatientSchema>>;
export type RegisterPatient = z.output<ReturnType<typeof registerPatientSchema>>;

/** Staff correcting details (every field optional), archiving or unarchiving. */
export function updatePatientSchema(ctx: PatientSchemaContext) {
  return z
    .object({
      name: nameField.optional(),
      email: emailField.optional(),
      dateOfBirth: birthDateField(ctx.today).optional(),
      phone: z.union([z.null(), phoneField(ctx.country)]),
      language: languageField.optional(),
      address: z.union([z.null(), addressField]),
      reminders: z.boolean().optional(),
      archived: z.boolean().optional(),
    })
    .partial()
    .strict();
}
export type UpdatePatient = z.output<ReturnType<typeof updatePatientSchema>>;

/** The signed-in patient changing their own preferences (a new e-mail waits for confirmation). */
export function updateMeSchema(country: CountryCode) {
  return z
    .object({
      phone: z.union([z.null(), phoneField(country)]),
      language: languageField.optional(),
      reminders: z.boolean().optional(),
      email: emailField.optional(),
    })
    .partial()
    .strict();
}
export type UpdateMe = z.output<ReturnType<typeof updateMeSchema>>;

/** Staff's view of the sign-in invitation. */
export type InvitationState =
  | { state: "not_invited" }
  | { state: "invited"; at: Date; expiresAt: Date }
  | { state: "signed_in"; at: Date; firstAt: Date };

export function invitationState(p: { lastInvitedAt: Date | null; invitationExpiresAt: Date | null; firstSignedInAt: Date | null; lastSignedInAt: Date | null }): InvitationState {
  if (p.lastSignedInAt) return { state: "signed_in", at: p.lastSignedInAt, firstAt: p.firstSignedInAt ?? p.lastSignedInAt };
  if (p.lastInvitedAt) return { state: "invited", at: p.lastInvitedAt, expiresAt: p.invitationExpiresAt ?? p.lastInvitedAt };
  return { state: "not_invited" };
}

/** Turns a staff search text into what the query needs: a folded LIKE pattern, digits for phones, a date. */
export function searchTerms(q: string): { text: string | null; digits: string | null; date: string | null } {
  const trimmed = q.trim().slice(0, 100);
  if (!trimmed) return { text: null, digits: null, date: null };
  const date = /^\d{4}-\d{2}-\d{2}$/.test(trimmed) ? trimmed : null;
  const digitsOnly = trimmed.replace(/[\s().+-]/g, "");
  const digits = /^\d{3,15}$/.test(digitsOnly) ? digitsOnly : null;
  return { text: trimmed.toLowerCase(), digits, date };
}

/** Escapes LIKE's wildcards so a typed "%" or "_" matches itself. */
export function likeContains(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** The patient's "My details" form: every field present; an empty phone clears it. */
export function myDetailsFormSchema(country: CountryCode) {
  return z.object({ phone: phoneField(country), language: languageField, reminders: z.boolean(), email: emailField });
}
export type MyDetailsFormInput = z.input<ReturnType<typeof myDetailsFormSchema>>;
export type MyDetailsForm = z.output<ReturnType<typeof myDetailsFormSchema>>;
