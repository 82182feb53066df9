// What the credentials provider throws, and which message the sign-in page shows for each. No
// zod here: the sign-in form's browser code imports this file.

export const SIGN_IN_FAILED = "That e-mail and password do not match an account. Check both and try again.";
export const SIGN_IN_LOCKED = "Too many sign-in attempts. Wait a little, then try again, or use a sign-in link.";
/** Returned (as the error) when the password was right and a two-factor code is needed next. */
export const CODE_NEEDED = "two-factor-code-needed";
export const CODE_FAILED = "That code did not work. Enter the current code from your authenticator app, or one of your recovery codes.";

export type SignInOutcome = "failed" | "locked" | "codeNeeded" | "codeFailed";

/**
 * The outcome of next-auth's `error` value (from a redirect's `?error=` or a JSON answer's URL).
 * Only known values are shown as such: the page never repeats text taken from its address.
 */
export function signInOutcome(error: string | null | undefined): SignInOutcome | null {
  if (!error) return null;
  if (error === CODE_NEEDED) return "codeNeeded";
  if (error === CODE_FAILED) return "codeFailed";
  if (error === SIGN_IN_LOCKED) return "locked";
  if (error === SIGN_IN_FAILED || error === "CredentialsSignin") return "failed";
  return null;
}
