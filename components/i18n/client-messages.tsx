import { NextIntlClientProvider } from "next-intl";
import { getMessages } from "next-intl/server";

type Messages = Record<string, unknown>;

/** The messages under `namespaces` ("booking", or a part of one: "payments.planForm"), in the same shape. */
export function pickMessages(all: Messages, namespaces: readonly string[]): Messages {
  const picked: Messages = {};
  for (const ns of namespaces) {
    const keys = ns.split(".");
    let from: unknown = all;
    for (const k of keys) from = from && typeof from === "object" ? (from as Messages)[k] : undefined;
    if (from === undefined) continue;
    let into = picked;
    for (const k of keys.slice(0, -1)) into = (into[k] ??= {}) as Messages;
    into[keys[keys.length - 1]] = from;
  }
  return picked;
}

/**
 * Messages for the client components inside, and only those: a page that needs none ships neither
 * the provider's code nor the message catalogue. Without `namespaces`, the whole catalogue.
 */
export async function ClientMessages({ namespaces, children }: { namespaces?: readonly string[]; children: React.ReactNode }) {
  const all = (await getMessages()) as Messages;
  return <NextIntlClientProvider messages={namespaces ? pickMessages(all, namespaces) : all}>{children}</NextIntlClientProvider>;
}
