// The page policy (Content-Security-Policy with a per-request nonce) and transport policy (HSTS)
// the proxy puts on every answer. Pure functions, so tests can read the policy without a server.

/** A fresh nonce: 16 random bytes, base64. */
export function newNonce(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return btoa(String.fromCharCode(...bytes));
}

/**
 * Scripts run only with this request's nonce (Next puts it on its own inline and file scripts);
 * styles are files, plus inline style attributes that React writes; images may be data: or blob:
 * (signature previews, photo previews); the consent PDF is framed from our own origin only.
 */
export function contentSecurityPolicy(nonce: string, opts: { https: boolean; dev: boolean }): string {
  const directives = [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${opts.dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "frame-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'self'",
    ...(opts.https ? ["upgrade-insecure-requests"] : []),
  ];
  return directives.join("; ");
}

/** Two years, subdomains included: sent only over https, where the browser honours it. */
export const STRICT_TRANSPORT_SECURITY = "max-age=63072000; includeSubDomains";

export function isHttps(url: URL, forwardedProto: string | null): boolean {
  return url.protocol === "https:" || forwardedProto?.split(",")[0]?.trim().toLowerCase() === "https";
}
