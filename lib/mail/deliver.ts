// Sends one outbox message at most once. The idempotency key is claimed in mail_sends (primary
// key) before SMTP is touched, so a retried job or a second worker finds the claim and does not
// send again; every attempt and its outcome goes into mail_attempts for reception to see.
import { QueryTypes } from "sequelize";
import type { Transporter } from "nodemailer";
import { sequelize } from "@/db/sequelize";
import type { AttemptOutcome } from "@/db/models/mail";
import { composeMail, loadMessage, type OutboxRow } from "./compose";
import { mailFrom, mailTransport } from "./transport";

/** How long a claim protects a send in progress; a crashed worker's claim is taken over after it. */
const LEASE_SECONDS = 180;

export type DeliveryResult = "sent" | "skipped" | "duplicate" | "gone";

export class SendInProgress extends Error {
  constructor() {
    super("Another worker is sending this message right now.");
    this.name = "SendInProgress";
  }
}

export type DeliverOptions = {
  /** 1 for the first try. */
  attempt: number;
  /** No retry follows a failure of this attempt. */
  finalAttempt: boolean;
  transport?: Transporter;
  now?: Date;
};

async function logAttempt(row: { id: string; appointmentId: string }, attempt: number, outcome: AttemptOutcome, detail: string | null) {
  await sequelize.query(
    `INSERT INTO mail_attempts (outbox_id, appointment_id, attempt, outcome, detail) VALUES ($1, $2, $3, $4, $5)`,
    { bind: [row.id, row.appointmentId, attempt, outcome, detail?.slice(0, 500) ?? null] },
  );
}

/** Ends a queued row (never overwrites an outcome another worker already wrote). */
async function finish(row: OutboxRow, state: "skipped" | "failed", reason: string | null) {
  await sequelize.query(`UPDATE mail_outbox SET state = $2, state_reason = $3, updated_at = now() WHERE id = $1 AND state = 'queued'`, {
    bind: [row.id, state, reason],
  });
}

/** Only a short, safe description of an SMTP failure is kept: no addresses, no message content. */
function describeError(err: unknown): string {
  const e = err as { code?: string; responseCode?: number; message?: string };
  const bits = [e.code, e.responseCode ? `SMTP ${e.responseCode}` : null].filter(Boolean);
  return bits.length ? `Mail server problem (${bits.join(", ")}).` : "Mail server problem.";
}

export async function deliverOutboxMessage(outboxId: string, opts: DeliverOptions): Promise<DeliveryResult> {
  const now = opts.now ?? new Date();
  const loaded = await loadMessage(outboxId);
  if (!loaded) return "gone";
  const { row, visit } = loaded;
  if (row.state === "cancelled") {
    await logAttempt(row, opts.attempt, "skipped", "Withdrawn before it was sent.");
    return "skipped";
  }
  if (row.state !== "queued") return "duplicate";

  const composed = await composeMail(row, visit, now);
  if ("skip" in composed) {
    await finish(row, "skipped", composed.skip);
    await logAttempt(row, opts.attempt, "skipped", composed.skip);
    return "skipped";
  }

  // Claim the key; take over only a claim whose lease has run out (its worker died mid-send).
  const claimed = await sequelize.query<{ key: string }>(
    `INSERT INTO mail_sends (idempotency_key, outbox_id, state, lease_until)
     VALUES ($1, $2, 'sending', now() + make_interval(secs => $3))
     ON CONFLICT (idempotency_key) DO UPDATE SET outbox_id = EXCLUDED.outbox_id, lease_until = EXCLUDED.lease_until
       WHERE mail_sends.state = 'sending' AND mail_sends.lease_until < now()
     RETURNING idempotency_key AS key`,
    { bind: [row.idempotencyKey, row.id, LEASE_SECONDS], type: QueryTypes.SELECT },
  );
  if (!claimed.length) {
    const [existing] = await sequelize.query<{ state: string }>(`SELECT state FROM mail_sends WHERE idempotency_key = $1`, {
      bind: [row.idempotencyKey],
      type: QueryTypes.SELECT,
    });
    if (existing?.state === "sent") {
      await finish(row, "skipped", "Already sent: the same message about the same visit time went out before.");
      await logAttempt(row, opts.attempt, "skipped", "Already sent earlier; not sent twice.");
      return "duplicate";
    }
    throw new SendInProgress();
  }

  const { mail } = composed;
  let smtpId: string | undefined;
  try {
    const info = await (opts.transport ?? mailTransport()).sendMail({
      from: mailFrom(),
      to: mail.to,
      subject: mail.subject,
      html: mail.html,
      text: mail.text,
      attachments: mail.attachments,
      headers: mail.headers,
      messageId: mail.messageId,
    });
    smtpId = info.messageId;
  } catch (err) {
    // Release the claim so the retry can send; nothing reached the server.
    await sequelize.query(`DELETE FROM mail_sends WHERE idempotency_key = $1 AND state = 'sending'`, { bind: [row.idempotencyKey] });
    const detail = describeError(err);
    if (opts.finalAttempt) {
      await finish(row, "failed", detail);
      await logAttempt(row, opts.attempt, "failed", `${detail} No more retries.`);
    } else {
      await logAttempt(row, opts.attempt, "retrying", `${detail} Will retry.`);
    }
    throw err;
  }

  // One statement, so the key, the outbox row and the log entry change together.
  await sequelize.query(
    `WITH s AS (
       UPDATE mail_sends SET state = 'sent', sent_at = now(), lease_until = NULL, message_id = $2 WHERE idempotency_key = $1 RETURNING 1
     ), o AS (
       UPDATE mail_outbox SET state = 'sent', state_reason = NULL, updated_at = now() WHERE id = $3 RETURNING 1
     )
     INSERT INTO mail_attempts (outbox_id, appointment_id, attempt, outcome, detail) VALUES ($3, $4, $5, 'sent', NULL)`,
    { bind: [row.idempotencyKey, smtpId ?? mail.messageId, row.id, row.appointmentId, opts.attempt] },
  );
  return "sent";
}
