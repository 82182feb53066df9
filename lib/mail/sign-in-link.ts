// Sends a patient their one-time sign-in link.
import { createElement } from "react";
import SignInLinkEmail from "@/emails/sign-in-link";
import { renderEmail } from "./render";
import { mailFrom, mailTransport } from "./transport";

export async function sendSignInLink({ to, url }: { to: string; url: string }) {
  const { html, text } = await renderEmail(createElement(SignInLinkEmail, { url }));
  await mailTransport().sendMail({ from: mailFrom(), to, subject: "Your Cuspal sign-in link", html, text });
}
