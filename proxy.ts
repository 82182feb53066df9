// Runs before every page: a per-request CSP nonce, HSTS over https, and next-auth's CSRF cookie
// when it is missing (so sign-in and sign-out are plain HTML forms). API answers skip it (it cost
// about as much CPU as a small route handler itself): their `Cache-Control: no-store` and HSTS are
// static headers in next.config.mjs.
import { NextResponse, type NextRequest } from "next/server";
import { csrfCookieName, newCsrfCookie, tokenOfCsrfCookie } from "@/lib/auth/csrf-cookie";
import { contentSecurityPolicy, isHttps, newNonce, STRICT_TRANSPORT_SECURITY } from "@/lib/server/security-headers";

export async function proxy(request: NextRequest) {
  const https = isHttps(request.nextUrl, request.headers.get("x-forwarded-proto"));
  const nonce = newNonce();
  const csp = contentSecurityPolicy(nonce, { https, dev: process.env.NODE_ENV === "development" });
  // Next reads the nonce from the request's CSP header and puts it on the scripts it writes.
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("Content-Security-Policy", csp);
  const csrf = await csrfCookieFor(request);
  if (csrf) {
    // The page reads the cookie from its request; the browser keeps it for the form's POST.
    request.cookies.set(csrf.name, csrf.value);
    requestHeaders.set("cookie", request.cookies.toString());
  }
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("Content-Security-Policy", csp);
  if (csrf) {
    response.cookies.set(csrf.name, csrf.value, { httpOnly: true, sameSite: "lax", path: "/", secure: csrf.name.startsWith("__Host-") });
  }
  if (https) response.headers.set("Strict-Transport-Security", STRICT_TRANSPORT_SECURITY);
  return response;
}

/** A new CSRF cookie when the request has none that next-auth would accept; null otherwise. */
async function csrfCookieFor(request: NextRequest): Promise<{ name: string; value: string } | null> {
  const secret = process.env.NEXTAUTH_SECRET;
  if (!secret || request.method !== "GET") return null;
  const name = csrfCookieName();
  if (await tokenOfCsrfCookie(request.cookies.get(name)?.value, secret)) return null;
  return { name, ...(await newCsrfCookie(secret)) };
}

export const config = {
  matcher: [
    // Pages only: not the API, build assets or the icon; prefetches of pages carry no HTML to protect.
    {
      source: "/((?!api/|_next/static|_next/image|favicon.ico|fonts/).*)",
      missing: [
        { type: "header", key: "next-router-prefetch" },
        { type: "header", key: "purpose", value: "prefetch" },
      ],
    },
  ],
};
