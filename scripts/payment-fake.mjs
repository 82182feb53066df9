// A local stand-in for the payment service, for the demo and the tests only (a test double, not
// the app). It answers exactly the REST calls Cuspal makes through the official SDK — create and
// read a Checkout Session, create a refund — with the same shapes: form-encoded bodies,
// `Authorization: Bearer <secret key>`, replayed answers for a repeated Idempotency-Key. It serves
// a stand-in hosted payment page at each session's URL and sends signed webhooks to the app
// (`Stripe-Signature: t=…,v1=HMAC-SHA256(secret, "t.payload")`). State lives in this one process.
// Node built-ins only.
import { createHmac, randomBytes, timingSafeEqual } from "node:crypto";
import http from "node:http";

const port = Number(process.env.PAYMENT_FAKE_PORT ?? 12111);
const secretKey = process.env.STRIPE_SECRET_KEY ?? "";
const webhookSecret = process.env.STRIPE_WEBHOOK_SECRET ?? "";
const webhookUrl = process.env.PAYMENT_FAKE_WEBHOOK_URL ?? "http://localhost:3000/api/payments/webhook";
const base = `http://127.0.0.1:${port}`;

if (!secretKey || !webhookSecret) {
  console.error("payment fake: STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET must be set (scripts/lib.mjs passes them).");
  process.exit(1);
}

const sessions = new Map();
const intents = new Map(); // payment intent id → { session, charge }
const idempotent = new Map(); // key → { status, body }
const now = () => Math.floor(Date.now() / 1000);
const newId = (prefix) => `${prefix}_fake${randomBytes(10).toString("hex")}`;

// Test cards: one that succeeds and one that is declined (the numbers the SDK's documentation uses).
const CARD_OK = "4242424242424242";
const CARD_DECLINED = "4000000000000002";

/** `a[0][b]=x` → { a: [{ b: "x" }] }, as the SDK encodes nested parameters. */
function parseForm(text) {
  const out = {};
  for (const [rawKey, value] of new URLSearchParams(text)) {
    const parts = rawKey.replace(/\]/g, "").split("[");
    let node = out;
    parts.forEach((part, i) => {
      const last = i === parts.length - 1;
      const nextIsIndex = !last && /^\d+$/.test(parts[i + 1]);
      if (last) node[part] = value;
      else node = node[part] ??= nextIsIndex ? [] : {};
    });
  }
  return out;
}

function readBody(req) {
  return new Promise((resolve, reject) => {
    const chunks = [];
    let size = 0;
    req.on("data", (c) => {
      size += c.length;
      if (size > 1_000_000) reject(new Error("body too large"));
      else chunks.push(c);
    });
    req.on("end", () => resolve(Buffer.concat(chunks).toString("utf8")));
    req.on("error", reject);
  });
}

function json(res, status, body, headers = {}) {
  res.writeHead(status, { "content-type": "application/json", "request-id": newId("req"), ...headers });
  res.end(JSON.stringify(body));
}

function apiError(res, status, type, message, param) {
  json(res, status, { error: { type, message, ...(param ? { param } : {}) } });
}

function authorised(req) {
  const given = Buffer.from(String(req.headers.authorization ?? ""));
  const wanted = Buffer.from(`Bearer ${secretKey}`);
  return given.length === wanted.length && timingSafeEqual(given, wanted);
}

function sign(payload) {
  const t = now();
  const v1 = createHmac("sha256", webhookSecret).update(`${t}.${payload}`, "utf8").digest("hex");
  return `t=${t},v1=${v1}`;
}

async function sendEvent(type, object) {
  const event = { id: newId("evt"), object: "event", api_version: "2025-01-01", created: now(), livemode: false, type, data: { object }, pending_webhooks: 1, request: { id: null, idempotency_key: null } };
  const payload = JSON.stringify(event);
  try {
    const r = await fetch(webhookUrl, { method: "POST", headers: { "content-type": "application/json", "stripe-signature": sign(payload) }, body: payload });
    console.log(`webhook ${type} ${event.id} → ${r.status}`);
  } catch (err) {
    console.log(`webhook ${type} ${event.id} not delivered: ${err.message}`);
  }
}

function createSession(params) {
  const items = params.line_items ?? [];
  if (params.mode !== "payment") return [400, "mode must be payment", "mode"];
  if (!items.length) return [400, "line_items is required", "line_items"];
  if (!params.success_url) return [400, "success_url is required", "success_url"];
  let amount = 0;
  let currency;
  for (const item of items) {
    const unit = Number(item.price_data?.unit_amount);
    const qty = Number(item.quantity ?? 1);
    if (!Number.isInteger(unit) || unit < 1) return [400, "unit_amount must be a positive integer", "line_items"];
    currency = String(item.price_data?.currency ?? "").toLowerCase();
    if (!/^[a-z]{3}$/.test(currency)) return [400, "currency must be an ISO 4217 code", "line_items"];
    amount += unit * qty;
  }
  const id = newId("cs_test");
  const session = {
    id, object: "checkout.session", mode: "payment", status: "open", payment_status: "unpaid",
    amount_total: amount, amount_subtotal: amount, currency, created: now(), expires_at: now() + 24 * 3600,
    client_reference_id: params.client_reference_id ?? null, customer_email: params.customer_email ?? null,
    metadata: params.metadata ?? {}, payment_intent: null, success_url: params.success_url, cancel_url: params.cancel_url ?? null,
    url: `${base}/pay/${id}`, livemode: false,
  };
  sessions.set(id, session);
  return [200, session];
}

function createRefund(params) {
  const entry = intents.get(params.payment_intent);
  if (!entry) return [404, `No such payment_intent: '${params.payment_intent}'`, "payment_intent"];
  const { charge } = entry;
  const left = charge.amount - charge.amount_refunded;
  const amount = params.amount ? Number(params.amount) : left;
  if (!Number.isInteger(amount) || amount < 1 || amount > left) return [400, "Refund amount is more than what is left on the charge.", "amount"];
  const refund = { id: newId("re"), object: "refund", amount, currency: charge.currency, charge: charge.id, payment_intent: charge.payment_intent, status: "succeeded", created: now(), metadata: params.metadata ?? {} };
  charge.amount_refunded += amount;
  charge.refunded = charge.amount_refunded === charge.amount;
  charge.refunds.data.unshift(refund);
  // After the answer, as the real service does: the app may still be inside its own transaction.
  setTimeout(() => void sendEvent("charge.refunded", structuredClone(charge)), 50);
  return [200, refund];
}

const page = (session, message = "") => `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Test payment</title>
<style>body{font:16px/1.5 system-ui,sans-serif;max-width:26rem;margin:2rem auto;padding:0 1rem;color:#1d2a33}
label{display:block;font-weight:600;margin-top:1rem}input{width:100%;box-sizing:border-box;font-size:1.1rem;padding:.6rem;border:1px solid #667;border-radius:.4rem}
button{margin-top:1rem;width:100%;font-size:1.1rem;padding:.7rem;border:0;border-radius:.4rem;background:#1f5f7a;color:#fff}
.note{background:#f3f0e8;padding:.6rem;border-radius:.4rem;font-size:.9rem}.err{color:#8a2b12;font-weight:600}</style></head>
<body><p class="note">Local test payment page: no real money moves. Test cards: 4242 4242 4242 4242 is accepted, 4000 0000 0000 0002 is declined.</p>
<h1>Pay ${(session.amount_total / 100).toFixed(2)} ${session.currency.toUpperCase()}</h1>
${message ? `<p class="err" role="alert">${message}</p>` : ""}
<form method="post" action="/pay/${session.id}">
<label for="card">Card number</label><input id="card" name="card" inputmode="numeric" autocomplete="off" required>
<button type="submit">Pay</button></form>
${session.cancel_url ? `<p><a href="${session.cancel_url}">Go back without paying</a></p>` : ""}
</body></html>`;

function html(res, status, body) {
  res.writeHead(status, { "content-type": "text/html; charset=utf-8", "cache-control": "no-store" });
  res.end(body);
}

async function payPage(req, res, id) {
  const session = sessions.get(id);
  if (!session) return html(res, 404, "<p>This payment link is not known. Start again from the clinic's page.</p>");
  if (req.method === "GET") {
    if (session.status === "complete") return html(res, 200, `<p>Already paid. <a href="${session.success_url.replace("{CHECKOUT_SESSION_ID}", id)}">Back to the clinic</a></p>`);
    return html(res, 200, page(session));
  }
  const card = String(new URLSearchParams(await readBody(req)).get("card") ?? "").replace(/[\s-]/g, "");
  if (session.status === "complete") return html(res, 409, "<p>Already paid.</p>");
  if (card === CARD_DECLINED) return html(res, 402, page(session, "Your card was declined. No money was taken. Try another card."));
  if (card !== CARD_OK) return html(res, 400, page(session, "This test page accepts only the test card numbers shown above."));
  const pi = newId("pi");
  const charge = { id: newId("ch"), object: "charge", amount: session.amount_total, amount_refunded: 0, currency: session.currency, payment_intent: pi, paid: true, refunded: false, status: "succeeded", created: now(), metadata: session.metadata, refunds: { object: "list", data: [] } };
  intents.set(pi, { session, charge });
  Object.assign(session, { status: "complete", payment_status: "paid", payment_intent: pi });
  await sendEvent("checkout.session.completed", structuredClone(session));
  res.writeHead(303, { location: session.success_url.replace("{CHECKOUT_SESSION_ID}", id) });
  res.end();
}

async function api(req, res, url) {
  if (!authorised(req)) return apiError(res, 401, "invalid_request_error", "Invalid API Key provided.");
  const key = req.method === "POST" ? req.headers["idempotency-key"] : undefined;
  if (key && idempotent.has(key)) {
    const prior = idempotent.get(key);
    return json(res, prior.status, prior.body, { "idempotent-replayed": "true" });
  }
  const params = req.method === "POST" ? parseForm(await readBody(req)) : Object.fromEntries(url.searchParams);
  let result;
  const m = url.pathname.match(/^\/v1\/checkout\/sessions\/([^/]+)$/);
  if (req.method === "POST" && url.pathname === "/v1/checkout/sessions") result = createSession(params);
  else if (req.method === "GET" && m) result = sessions.has(m[1]) ? [200, sessions.get(m[1])] : [404, `No such checkout.session: '${m[1]}'`, "id"];
  else if (req.method === "POST" && url.pathname === "/v1/refunds") result = createRefund(params);
  else result = [404, `Unrecognized request URL (${req.method}: ${url.pathname}). This fake answers only the calls Cuspal makes.`];
  const [status, bodyOrMessage, param] = result;
  const body = status === 200 ? bodyOrMessage : { error: { type: "invalid_request_error", message: bodyOrMessage, ...(param ? { param } : {}) } };
  if (key) idempotent.set(key, { status, body });
  json(res, status, body);
}

const server = http.createServer((req, res) => {
  const url = new URL(req.url ?? "/", base);
  const handle = url.pathname.startsWith("/pay/") ? payPage(req, res, url.pathname.slice(5)) : url.pathname.startsWith("/v1/") ? api(req, res, url) : Promise.resolve(html(res, 404, "<p>Payment fake: nothing here.</p>"));
  handle.catch((err) => {
    console.error("payment fake error:", err.message);
    if (!res.headersSent) apiError(res, 500, "api_error", "The payment fake failed.");
  });
});

server.listen(port, "127.0.0.1", () => console.log(`payment fake listening on ${base}, webhooks to ${webhookUrl}`));
const stop = () => server.close(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
