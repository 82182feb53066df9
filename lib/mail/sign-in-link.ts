// Sends a patient their one-time sign-in link.
import { createElement } from "react";
import SignInLinkEmail from "@/emails/sign-in-link";
import { languageForEmail } from "@/lib/data/language";
import { emailTranslator } from "@/lib/i18n/email";
import { renderEmail } from "./render";
import { mailFrom, mailTransport } from "./transport";

export async function sendSignInLink({ to, url }: { to: string; url: string }) {
  const t = emailTranslator(await languageForEmail(to));
  const { html, text } = await renderEmail(createElement(SignInLinkEmail, { url, t }));
  await mailTransport().sendMail({ from: mailFrom(), to, subject: t("signIn.subject"), html, text });
}
