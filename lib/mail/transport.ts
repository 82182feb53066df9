// One nodemailer transport for the app, the worker and the tests, pointed at SMTP_URL.
import nodemailer, { type Transporter } from "nodemailer";

let transport: Transporter | undefined;

export function mailTransport(): Transporter {
  transport ??= nodemailer.createTransport(process.env.SMTP_URL ?? "smtp://127.0.0.1:1025");
  return transport;
}

export function mailFrom(): string {
  return process.env.MAIL_FROM ?? "Cuspal <no-reply@cuspal.test>";
}
