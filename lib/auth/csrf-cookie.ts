// The double-submit token that next-auth checks on every POST to /api/auth/* (sign-in, sign-out),
// made the way next-auth makes it (`token|sha256(token + secret)`), so plain HTML forms can carry
// it without the browser first asking /api/auth/csrf. Web Crypto only: the proxy runs this too.

/** next-auth's cookie name: `__Host-` when NEXTAUTH_URL is https (its `useSecureCookies`). */
export function csrfCookieName(nextAuthUrl = process.env.NEXTAUTH_URL ?? ""): string {
  return `${nextAuthUrl.startsWith("https://") ? "__Host-" : ""}next-auth.csrf-token`;
}

async function sha256Hex(text: string): Promise<string> {
  const digest = await crypto.subtle.digest("SHA-256", new TextEncoder().encode(text));
  return Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, "0")).join("");
}

/** The token inside a cookie value, or null when the value was not made with this secret. */
export async function tokenOfCsrfCookie(value: string | undefined, secret: string): Promise<string | null> {
  if (!value) return null;
  const [token, hash] = value.split("|");
  if (!token || !hash) return null;
  return (await sha256Hex(`${token}${secret}`)) === hash ? token : null;
}

/** A new token (32 random bytes, hex) and the cookie value that vouches for it. */
export async function newCsrfCookie(secret: string): Promise<{ token: string; value: string }> {
  const bytes = new Uint8Array(32);
  crypto.getRandomValues(bytes);
  const token = Array.from(bytes, (b) => b.toString(16).padStart(2, "0")).join("");
  return { token, value: `${token}|${await sha256Hex(`${token}${secret}`)}` };
}
