// Runs before every page and API answer: a per-request CSP nonce for pages, HSTS over https, and
// `Cache-Control: no-store` on every API answer (they hold personal data).
import { NextResponse, type NextRequest } from "next/server";
import { contentSecurityPolicy, isHttps, newNonce, STRICT_TRANSPORT_SECURITY } from "@/lib/server/security-headers";

export function proxy(request: NextRequest) {
  const https = isHttps(request.nextUrl, request.headers.get("x-forwarded-proto"));
  const isApi = request.nextUrl.pathname.startsWith("/api/");
  let response: NextResponse;
  if (isApi) {
    response = NextResponse.next();
    response.headers.set("Cache-Control", "no-store");
  } else {
    const nonce = newNonce();
    const csp = contentSecurityPolicy(nonce, { https, dev: process.env.NODE_ENV === "development" });
    // Next reads the nonce from the request's CSP header and puts it on the scripts it writes.
    const requestHeaders = new Headers(request.headers);
    requestHeaders.set("x-nonce", nonce);
    requestHeaders.set("Content-Security-Policy", csp);
    response = NextResponse.next({ request: { headers: requestHeaders } });
    response.headers.set("Content-Security-Policy", csp);
  }
  if (https) response.headers.set("Strict-Transport-Security", STRICT_TRANSPORT_SECURITY);
  return response;
}

export const config = {
  matcher: [
    // Everything but build assets and the icon; prefetches of pages carry no HTML to protect.
    {
      source: "/((?!_next/static|_next/image|favicon.ico|fonts/).*)",
      missing: [
        { type: "header", key: "next-router-prefetch" },
        { type: "header", key: "purpose", value: "prefetch" },
      ],
    },
  ],
};
