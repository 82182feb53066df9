// One nodemailer transport for the app, the worker and the tests, pointed at SMTP_URL.
import nodemailer, { type Transporter } from "nodemailer";

let transport: Transporter | undefined;

/** Transport options for an SMTP URL: pooled connections and short timeouts, so a dead server fails fast and the job retries. */
export function smtpOptions(url: string) {
  return {
    url,
    pool: true,
    maxConnections: 4,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  };
}

export function mailTransport(): Transporter {
  transport ??= nodemailer.createTransport(smtpOptions(process.env.SMTP_URL ?? "smtp://127.0.0.1:1025"));
  return transport;
}

export function mailFrom(): string {
  return process.env.MAIL_FROM ?? "Cuspal <no-reply@cuspal.test>";
}

/** The bare address of mailFrom(), e.g. for a calendar file's organizer. */
export function mailFromAddress(): string {
  const from = mailFrom();
  return from.match(/<([^>]+)>/)?.[1] ?? from.trim();
}
