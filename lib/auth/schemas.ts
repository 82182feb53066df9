// The sign-in form's schema, shared by the form and the credentials provider.
import { z } from "zod";

export const signInSchema = z.object({
  email: z.string().trim().toLowerCase().email({ message: "Enter your e-mail address, like name@example.com." }),
  password: z.string().min(1, { message: "Enter your password." }).max(200, { message: "That password is too long." }),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const signInLinkSchema = z.object({
  email: z.string().trim().toLowerCase().email({ message: "Enter your e-mail address, like name@example.com." }),
});

export const SIGN_IN_FAILED = "That e-mail and password do not match an account. Check both and try again.";
export const SIGN_IN_LOCKED = "Too many sign-in attempts. Wait 15 minutes, then try again, or use a sign-in link.";
