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

export const SIGN_IN_FAILED = "That e-mail and password do not match an account. Check both and try again.";
export const SIGN_IN_LOCKED = "Too many sign-in attempts. Wait a little, then try again, or use a sign-in link.";
/** Returned (as the error) when the password was right and a two-factor code is needed next. */
export const CODE_NEEDED = "two-factor-code-needed";
export const CODE_FAILED = "That code did not work. Enter the current code from your authenticator app, or one of your recovery codes.";

/** The enrolment form: the first code the app shows, proving it holds the secret. */
export const enrolSchema = z.object({
  code: z.string().trim().regex(/^\d{6}$/, { message: "Enter the 6-digit code your app shows." }),
});
export type EnrolInput = z.infer<typeof enrolSchema>;
