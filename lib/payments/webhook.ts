// Handles one verified payment-service event, once. The event id goes into payment_events (its
// primary key) in the same transaction as the deposit change, its audit event and its receipt,
// so a replayed event finds its id and changes nothing, and a crash mid-way leaves nothing half done.
import "server-only";
import { QueryTypes, type Transaction } from "sequelize";
import type Stripe from "stripe";
import { sequelize } from "@/db/models";
import { depositById, markPaid, markRefunded, refundDeposit, type DepositRow } from "./deposits";

export type WebhookOutcome = "handled" | "duplicate" | "ignored";

const COLUMNS_BY = { session: "checkout_session_id", intent: "payment_intent_id" } as const;

async function findDeposit(opts: { depositId?: string | null; session?: string | null; intent?: string | null }, transaction: Transaction): Promise<DepositRow | null> {
  if (opts.depositId) {
    const byId = await depositById(opts.depositId, { transaction, lock: true });
    if (byId) return byId;
  }
  for (const [key, column] of Object.entries(COLUMNS_BY) as [keyof typeof COLUMNS_BY, string][]) {
    const value = opts[key];
    if (!value) continue;
    const [row] = await sequelize.query<{ id: string }>(`SELECT id FROM deposits WHERE ${column} = $1`, { bind: [value], transaction, type: QueryTypes.SELECT });
    if (row) return depositById(row.id, { transaction, lock: true });
  }
  return null;
}

const idOf = (v: string | { id: string } | null | undefined) => (typeof v === "string" ? v : v?.id ?? null);

export async function handlePaymentEvent(event: Stripe.Event): Promise<WebhookOutcome> {
  let refundLate = null as string | null;
  const outcome = await sequelize.transaction(async (transaction): Promise<WebhookOutcome> => {
    const claimed = await sequelize.query(`INSERT INTO payment_events (event_id, type) VALUES ($1, $2) ON CONFLICT (event_id) DO NOTHING RETURNING event_id`, {
      bind: [event.id, event.type], transaction, type: QueryTypes.SELECT,
    });
    if (!claimed.length) return "duplicate";

    let deposit: DepositRow | null = null;
    if (event.type === "checkout.session.completed") {
      const session = event.data.object;
      if (session.payment_status !== "paid") return "ignored";
      deposit = await findDeposit({ depositId: session.metadata?.depositId ?? session.client_reference_id, session: session.id }, transaction);
      if (!deposit) return "ignored";
      // The amount is the server's own; a session for another amount or currency is not ours to accept.
      if (session.amount_total !== deposit.amountCents || session.currency?.toUpperCase() !== deposit.currency) {
        console.error(`Payment event ${event.id} does not match deposit ${deposit.id}: amount or currency differs.`);
        return "ignored";
      }
      const result = await markPaid(deposit, idOf(session.payment_intent), new Date(event.created * 1000), "webhook", transaction);
      if (result === "late") refundLate = deposit.id;
    } else if (event.type === "charge.refunded") {
      const charge = event.data.object;
      if (!charge.refunded) return "ignored"; // partial refunds are not made by Cuspal
      deposit = await findDeposit({ depositId: charge.metadata?.depositId, intent: idOf(charge.payment_intent) }, transaction);
      if (!deposit) return "ignored";
      await markRefunded(deposit, charge.refunds?.data?.[0]?.id ?? null, "webhook", transaction);
    } else {
      return "ignored";
    }
    await sequelize.query(`UPDATE payment_events SET deposit_id = $2 WHERE event_id = $1`, { bind: [event.id, deposit.id], transaction });
    return "handled";
  });
  // Paid after the hold was released or the deposit waived: the money goes straight back.
  if (refundLate) await refundDeposit(refundLate, "paid after the deposit was closed", null);
  return outcome;
}
