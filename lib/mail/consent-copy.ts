// Sends the patient their copy of a signed consent, with the PDF attached. The message goes
// through the outbox like every other one (the PDF is kept with it in PostgreSQL), so it survives
// a crash or a mail server outage; pass the signing transaction to commit it with the signature.
import { createHash } from "node:crypto";
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "@/db/sequelize";
import { enqueueMail } from "./outbox";

export type ConsentCopyInput = {
  appointmentId: string;
  pdf: Buffer;
  /** The attachment's name as the patient sees it, e.g. "consent-2027-03-15.pdf". */
  filename: string;
  transaction?: Transaction;
};

const MAX_PDF_BYTES = 15 * 1024 * 1024;

/** Queues the e-mail; returns the outbox id. The same PDF for the same visit is only ever sent once. */
export async function sendConsentCopy({ appointmentId, pdf, filename, transaction }: ConsentCopyInput): Promise<{ outboxId: string }> {
  if (!Buffer.isBuffer(pdf) || pdf.subarray(0, 5).toString("latin1") !== "%PDF-") throw new Error("sendConsentCopy needs the PDF's bytes.");
  if (pdf.length > MAX_PDF_BYTES) throw new Error("The consent PDF is too large to send by e-mail.");
  const safeName = filename.replace(/[^\w.\- ]+/g, "_").slice(0, 100) || "consent.pdf";
  const [visit] = await sequelize.query<{ clinicId: string; startsAt: Date }>(
    `SELECT clinic_id AS "clinicId", starts_at AS "startsAt" FROM appointments WHERE id = $1`,
    { bind: [appointmentId], transaction, type: QueryTypes.SELECT },
  );
  if (!visit) throw new Error(`No visit ${appointmentId} to send a consent copy for.`);
  const digest = createHash("sha256").update(pdf).digest("hex");
  const [outboxId] = await enqueueMail(
    [{
      clinicId: visit.clinicId,
      appointmentId,
      kind: "consent_copy",
      visitStartsAt: visit.startsAt,
      keyKind: `consent_copy:${digest.slice(0, 16)}`,
      data: { filename: safeName.toLowerCase().endsWith(".pdf") ? safeName : `${safeName}.pdf`, sha256: digest },
      attachment: pdf,
    }],
    transaction,
  );
  return { outboxId };
}
