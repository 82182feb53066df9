// The sign-in form's schema, shared by the form and the credentials provider.
import { z } from "zod";

export const signInSchema = z.object({
  email: z.string().trim().toLowerCase().email({ message: "Enter your e-mail address, like name@example.com." }),
  password: z.string().min(1, { message: "Enter your password." }).max(200, { message: "That password is too long." }),
  // The second step for staff who use two-factor sign-in: a 6-digit code or a recovery code.
  code: z.string().trim().max(40).optional().transform((v) => (v ? v : undefined)),
});
export type SignInInput = z.input<typeof signInSchema>;

export const signInLinkSchema = z.object({
  email: z.string().trim().toLowerCase().email({ message: "Enter your e-mail address, like name@example.com." }),
});

export { CODE_FAILED, CODE_NEEDED, SIGN_IN_FAILED, SIGN_IN_LOCKED } from "./sign-in-errors";

/** The enrolment form: the first code the app shows, proving it holds the secret. */
export const enrolSchema = z.object({
  code: z.string().trim().regex(/^\d{6}$/, { message: "Enter the 6-digit code your app shows." }),
});
export type EnrolInput = z.infer<typeof enrolSchema>;
