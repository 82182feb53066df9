// The answer headers only `next start` shows: a Content-Security-Policy with a fresh nonce that
// Next's own scripts carry (pages still work under it), HSTS over https, API answers never cached,
// and mutating API requests refused from foreign pages or with a non-JSON body.
import { expect, test, type Page } from "@playwright/test";
import { pdfDocument } from "../support/sample-files";
import { signIn } from "./support";

function cspViolations(page: Page): string[] {
  const seen: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy|Content-Security-Policy/i.test(m.text())) seen.push(m.text());
  });
  return seen;
}

test("pages carry a nonce-based CSP, their scripts carry its nonce, and they run under it", async ({ page }) => {
  const violations = cspViolations(page);
  const res = await page.goto("/");
  const csp = res!.headers()["content-security-policy"];
  const nonce = /'nonce-([^']+)'/.exec(csp)?.[1];
  expect(nonce, csp).toBeTruthy();
  expect(csp).toContain("object-src 'none'");
  expect(csp).toContain("frame-ancestors 'self'");
  expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
  // Every script Next wrote into the page has this request's nonce.
  const scripts = await page.locator("script").evaluateAll((els) => els.map((e) => (e as HTMLScriptElement).nonce));
  expect(scripts.length).toBeGreaterThan(0);
  expect(scripts.every((n) => n === nonce)).toBe(true);
  // A second request gets another nonce.
  const again = await page.request.get("/");
  expect(/'nonce-([^']+)'/.exec(again.headers()["content-security-policy"])?.[1]).not.toBe(nonce);

  // Hydrated and interactive under the policy: signing in is a client-side form.
  await signIn(page, "reception@cuspal.test");
  await expect(page).toHaveURL(/\/clinic/);
  await page.goto("/clinic/board");
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  expect(violations).toEqual([]);
});

test("HSTS only when served over https (as a TLS proxy says with X-Forwarded-Proto)", async ({ request }) => {
  expect((await request.get("/sign-in")).headers()["strict-transport-security"]).toBeUndefined();
  const https = await request.get("/sign-in", { headers: { "x-forwarded-proto": "https" } });
  expect(https.headers()["strict-transport-security"]).toMatch(/^max-age=\d{8,}/);
  expect(https.headers()["content-security-policy"]).toContain("upgrade-insecure-requests");
  // API answers too (their headers come from next.config.mjs, not the proxy).
  expect((await request.get("/api/health/live")).headers()["strict-transport-security"]).toBeUndefined();
  const api = await request.get("/api/health/live", { headers: { "x-forwarded-proto": "https" } });
  expect(api.headers()["strict-transport-security"]).toMatch(/^max-age=\d{8,}/);
});

test("API answers are never cached, the live check needs no database, and the API document is public", async ({ request }) => {
  for (const path of ["/api/health", "/api/health/live", "/api/staff", "/api/openapi.json", "/api/auth/csrf"]) {
    const res = await request.get(path);
    expect(res.headers()["cache-control"], path).toMatch(/no-store/);
  }
  expect(await (await request.get("/api/health/live")).json()).toEqual({ ok: true });
  const doc = await (await request.get("/api/openapi.json")).json();
  expect(doc.openapi).toBe("3.1.0");
  expect(Object.keys(doc.paths)).toContain("/api/proposals/{id}/availability");
});

test("mutating API requests from another site, or not as JSON, are refused", async ({ page }) => {
  await signIn(page, "dentist@cuspal.test");
  const body = JSON.stringify({ patientId: "6d0c1a2b-0000-4000-8000-000000000000", tooth: 36, fee: 1, options: [] });
  const foreign = await page.request.post("/api/proposals", { data: body, headers: { origin: "https://attacker.example", "content-type": "application/json", "accept-encoding": "gzip" } });
  expect(foreign.status()).toBe(403);
  const plain = await page.request.post("/api/proposals", { data: body, headers: { "content-type": "text/plain" } });
  // API answers are compressed whole by the server, and only from 1 kB (scripts/api-answer-encoding.mjs).
  expect(foreign.headers()["content-encoding"]).toBeUndefined();
  const doc = await page.request.get("/api/openapi.json", { headers: { "accept-encoding": "gzip" } });
  expect(doc.headers()["content-encoding"]).toBe("gzip");
  expect(plain.status()).toBe(415);
  // The app's own pages still post: a same-origin JSON request gets past the checks to validation.
  const own = await page.request.post("/api/proposals", { data: body, headers: { "content-type": "application/json" } });
  expect(own.status()).toBe(400);
});

test("an uploaded PDF is served as a download with a sandboxing policy, never shown from our origin", async ({ page }) => {
  await signIn(page, "patient@cuspal.test");
  const form = { kind: "other", title: "Header check", file: { name: "h.pdf", mimeType: "application/pdf", buffer: pdfDocument("header check") } };
  const up = await page.request.post("/api/documents", { multipart: form });
  expect(up.status()).toBe(201);
  const { id } = await up.json();
  const res = await page.request.get(`/api/documents/${id}`);
  expect(res.headers()["content-disposition"]).toMatch(/^attachment;/);
  expect(res.headers()["content-security-policy"]).toMatch(/^sandbox/);
});
