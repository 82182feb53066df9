// Runs before every page: a per-request CSP nonce and HSTS over https. API answers skip it (it cost
// about as much CPU as a small route handler itself): their `Cache-Control: no-store` and HSTS are
// static headers in next.config.mjs.
import { NextResponse, type NextRequest } from "next/server";
import { contentSecurityPolicy, isHttps, newNonce, STRICT_TRANSPORT_SECURITY } from "@/lib/server/security-headers";

export function proxy(request: NextRequest) {
  const https = isHttps(request.nextUrl, request.headers.get("x-forwarded-proto"));
  const nonce = newNonce();
  const csp = contentSecurityPolicy(nonce, { https, dev: process.env.NODE_ENV === "development" });
  // Next reads the nonce from the request's CSP header and puts it on the scripts it writes.
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("Content-Security-Policy", csp);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("Content-Security-Policy", csp);
  if (https) response.headers.set("Strict-Transport-Security", STRICT_TRANSPORT_SECURITY);
  return response;
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
