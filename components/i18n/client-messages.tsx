import { NextIntlClientProvider } from "next-intl";
import { getMessages } from "next-intl/server";
import { pickMessages } from "./pick-messages";

/**
 * Messages for the client components inside, and only those: a page that needs none ships neither
 * the provider's code nor the message catalogue. Without `namespaces`, the whole catalogue.
 */
export async function ClientMessages({ namespaces, children }: { namespaces?: readonly string[]; children: React.ReactNode }) {
  const all = (await getMessages()) as Record<string, unknown>;
  return <NextIntlClientProvider messages={namespaces ? pickMessages(all, namespaces) : all}>{children}</NextIntlClientProvider>;
}
