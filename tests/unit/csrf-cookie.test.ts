// The CSRF cookie the proxy makes for plain sign-in and sign-out forms must be one next-auth itself
// accepts: checked with next-auth 4's own createCSRFToken (the general-purpose reference here).
import { createRequire } from "node:module";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { csrfCookieName, newCsrfCookie, tokenOfCsrfCookie } from "@/lib/auth/csrf-cookie";

// Not in next-auth's exports map, so loaded by its file path.
const { createCSRFToken } = createRequire(import.meta.url)(path.join(process.cwd(), "node_modules/next-auth/core/lib/csrf-token.js")) as {
  createCSRFToken(args: { options: { secret: string }; cookieValue?: string; isPost?: boolean; bodyValue?: string }): Record<string, unknown>;
};
const SECRET = "a-test-secret-of-some-length-0123456789";

describe("next-auth CSRF cookie", () => {
  it("is accepted by next-auth: same token back, and a POST carrying it is verified", async () => {
    const { token, value } = await newCsrfCookie(SECRET);
    expect(token).toMatch(/^[0-9a-f]{64}$/);
    const checked = createCSRFToken({ options: { secret: SECRET }, cookieValue: value, isPost: true, bodyValue: token });
    expect(checked).toEqual({ csrfTokenVerified: true, csrfToken: token });
  });

  it("reads the token of a cookie next-auth made, and refuses one made with another secret", async () => {
    const made = createCSRFToken({ options: { secret: SECRET } }) as unknown as { cookie: string; csrfToken: string };
    expect(await tokenOfCsrfCookie(made.cookie, SECRET)).toBe(made.csrfToken);
    expect(await tokenOfCsrfCookie(made.cookie, `${SECRET}-other`)).toBeNull();
    expect(await tokenOfCsrfCookie(`${made.csrfToken}|`, SECRET)).toBeNull();
    expect(await tokenOfCsrfCookie(undefined, SECRET)).toBeNull();
  });

  it("uses next-auth's cookie names: __Host- only behind an https NEXTAUTH_URL", () => {
    expect(csrfCookieName("http://localhost:3000")).toBe("next-auth.csrf-token");
    expect(csrfCookieName("https://portal.example.org")).toBe("__Host-next-auth.csrf-token");
  });
});
