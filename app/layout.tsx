import type { Metadata, Viewport } from "next";
import localFont from "next/font/local";
import { connection } from "next/server";
import { getLocale, getTranslations } from "next-intl/server";
import "./globals.css";

// Geist (SIL Open Font License), shipped in public/fonts: nothing is fetched from a font service.
// Preloaded, and `optional`: used when it arrives with the first paint, else the fallback stays for
// this page, so text never reflows under the reader (a late swap moved the proposal page: CLS 0.08).
const geist = localFont({ src: "../public/fonts/Geist-Variable.woff2", variable: "--font-geist", display: "optional", weight: "100 900" });

export async function generateMetadata(): Promise<Metadata> {
  const t = await getTranslations("meta");
  return { title: { default: t("title"), template: "%s · Cuspal" }, description: t("description") };
}

export const viewport: Viewport = { width: "device-width", initialScale: 1, themeColor: "#0d6e6e" };

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page is rendered per request, so each one carries the nonce of its Content-Security-Policy.
  await connection();
  const locale = await getLocale();
  const t = await getTranslations("common");
  return (
    <html lang={locale} className={geist.variable}>
      <body className="min-h-dvh font-sans">
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:p-2">
          {t("skipToContent")}
        </a>
        {/* No message provider here: client components that need messages get theirs (ClientMessages). */}
        {children}
      </body>
    </html>
  );
}
