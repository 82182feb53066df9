// Renders a react-email template to HTML and plain text, the two parts of every message.
// React renders once; the text part is derived from that HTML (the same conversion
// react-email's own plain-text mode applies), which halves the work per message.
import { render, toPlainText } from "@react-email/render";
import type { ReactElement } from "react";

export async function renderEmail(element: ReactElement): Promise<{ html: string; text: string }> {
  const html = await render(element);
  return { html, text: toPlainText(html) };
}
