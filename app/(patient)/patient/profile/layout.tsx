import { ClientMessages } from "@/components/i18n/client-messages";

// The forms on these pages are client components that read their own messages.
export default function MessagesLayout({ children }: { children: React.ReactNode }) {
  return <ClientMessages>{children}</ClientMessages>;
}
