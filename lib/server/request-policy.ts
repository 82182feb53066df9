// What a mutating API request must show before its handler runs: the app's own Origin and the
// content type the route reads. The exemptions are listed here, in one place, each with its reason.

export const MUTATING_METHODS = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/** Routes whose callers are not our pages, so a foreign or missing Origin is expected there. */
export const ORIGIN_CHECK_EXEMPT: readonly { path: RegExp; why: string }[] = [
  { path: /^\/api\/auth\//, why: "next-auth's own routes carry and check their CSRF token" },
  { path: /^\/api\/payments\/webhook$/, why: "the payment provider calls it server to server and it verifies the provider's signature" },
  { path: /^\/api\/reminders\/[^/]+$/, why: "mail programs send the one-click unsubscribe POST of RFC 8058; the signed token in the path authorises it" },
];

export type BodyKind = "json" | "multipart" | "form-or-json";

const ACCEPTED: Record<BodyKind, readonly string[]> = {
  json: ["application/json"],
  multipart: ["multipart/form-data"],
  "form-or-json": ["application/json", "application/x-www-form-urlencoded", "multipart/form-data"],
};

export function isOriginExempt(pathname: string): boolean {
  return ORIGIN_CHECK_EXEMPT.some((e) => e.path.test(pathname));
}

/** The media type without parameters, lower case ("application/json; charset=utf-8" → "application/json"). */
export function mediaType(header: string | null): string | null {
  const type = header?.split(";")[0]?.trim().toLowerCase();
  return type ? type : null;
}

export function acceptsType(kind: BodyKind, header: string | null): boolean {
  const type = mediaType(header);
  return type !== null && ACCEPTED[kind].includes(type);
}

export function expectedTypeText(kind: BodyKind): string {
  return ACCEPTED[kind].join(" or ");
}

/**
 * Whether the request may come from a page of ours. Browsers send Origin on every POST, PUT, PATCH
 * and DELETE; a request without one is not a browser form or script (an API client), unless the
 * browser's Sec-Fetch-Site says it crossed sites.
 */
export function isSameOrigin(headers: Headers, ownOrigins: readonly string[]): boolean {
  const origin = headers.get("origin");
  if (origin === null) return headers.get("sec-fetch-site") !== "cross-site";
  if (origin === "null") return false;
  let host: string;
  try {
    host = new URL(origin).host.toLowerCase();
  } catch {
    return false;
  }
  return ownOrigins.some((o) => o.toLowerCase() === host);
}

/** The hosts this app answers as: the Host the request reached (or the proxy's forwarded host) and APP_URL's. */
export function ownHosts(headers: Headers, requestUrl: string, appUrl = process.env.APP_URL): string[] {
  const hosts = [headers.get("x-forwarded-host")?.split(",")[0]?.trim(), headers.get("host"), safeHost(requestUrl), appUrl ? safeHost(appUrl) : undefined];
  return hosts.filter((h): h is string => !!h);
}

function safeHost(url: string): string | undefined {
  try {
    return new URL(url).host;
  } catch {
    return undefined;
  }
}
