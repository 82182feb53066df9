// The payment service's official SDK, configured once. STRIPE_API_URL points it at the local fake
// (plain HTTP on loopback); without it the SDK talks to the real service.
import "server-only";
import Stripe from "stripe";
import { env } from "@/lib/env";

declare global {
  var __cuspalStripe: Stripe | undefined;
}

export function payments(): Stripe {
  if (globalThis.__cuspalStripe) return globalThis.__cuspalStripe;
  const { STRIPE_SECRET_KEY, STRIPE_API_URL } = env();
  if (!STRIPE_SECRET_KEY) throw new Error("Payments are not configured: set STRIPE_SECRET_KEY (npm run demo and npm test set a local one).");
  const local = STRIPE_API_URL ? new URL(STRIPE_API_URL) : null;
  globalThis.__cuspalStripe = new Stripe(STRIPE_SECRET_KEY, {
    ...(local
      ? { host: local.hostname, port: Number(local.port || (local.protocol === "https:" ? 443 : 80)), protocol: local.protocol.replace(":", "") as "http" | "https" }
      : {}),
    // Our own retries are the idempotency keys and the webhook; a hung call must not hold a request.
    maxNetworkRetries: 0,
    timeout: 10_000,
  });
  return globalThis.__cuspalStripe;
}

/** Verifies the signature on the raw body and returns the event, or throws. */
export function verifyWebhook(rawBody: string, signature: string | null): Stripe.Event {
  if (!signature) throw new Error("No signature header.");
  const secret = env().STRIPE_WEBHOOK_SECRET;
  if (!secret) throw new Error("Payments are not configured: set STRIPE_WEBHOOK_SECRET.");
  return payments().webhooks.constructEvent(rawBody, signature, secret);
}
