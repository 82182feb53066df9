import { NextResponse, type NextRequest } from "next/server";
import { verifyWebhook } from "@/lib/payments/client";
import { handlePaymentEvent } from "@/lib/payments/webhook";
import { route } from "@/lib/server/api";

export const dynamic = "force-dynamic";

/** The payment service's events. No session: the signature over the raw body is the authorisation. */
export const POST = route(async (req: NextRequest) => {
  const raw = await req.text();
  let event;
  try {
    event = verifyWebhook(raw, req.headers.get("stripe-signature"));
  } catch {
    return NextResponse.json({ error: "The signature does not match this event." }, { status: 400 });
  }
  const outcome = await handlePaymentEvent(event);
  return NextResponse.json({ received: true, outcome });
});
