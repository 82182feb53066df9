import type { Metadata, Viewport } from "next";
import localFont from "next/font/local";
import { connection } from "next/server";
import "./globals.css";

// Geist (SIL Open Font License), shipped in public/fonts: nothing is fetched from a font service.
const geist = localFont({ src: "../public/fonts/Geist-Variable.woff2", variable: "--font-geist", display: "swap", weight: "100 900" });

export const metadata: Metadata = {
  title: { default: "Cuspal — same-day crown visits", template: "%s · Cuspal" },
  description: "Plan, book and consent to a single-visit crown with your clinic.",
};

export const viewport: Viewport = { width: "device-width", initialScale: 1, themeColor: "#0d6e6e" };

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page is rendered per request, so each one carries the nonce of its Content-Security-Policy.
  await connection();
  return (
    <html lang="en" className={geist.variable}>
      <body className="min-h-dvh font-sans">
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:p-2">
          Skip to content
        </a>
        {children}
      </body>
    </html>
  );
}
