import type { Metadata } from "next";
import localFont from "next/font/local";
import { connection } from "next/server";
import { Providers } from "./providers";
import { displayTimeZone } from "@/lib/format";
import "./globals.css";

const inter = localFont({
  src: [
    { path: "./fonts/inter-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "./fonts/inter-latin-500-normal.woff2", weight: "500", style: "normal" },
    { path: "./fonts/inter-latin-600-normal.woff2", weight: "600", style: "normal" },
    { path: "./fonts/inter-latin-700-normal.woff2", weight: "700", style: "normal" },
  ],
  variable: "--font-inter",
  display: "swap",
});

export const metadata: Metadata = {
  title: { default: "Pourline", template: "%s · Pourline" },
  description: "Plan bridge-deck overlay work under traffic and know how sure the finish date is.",
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page renders per request: its scripts carry the nonce of its own answer (src/lib/http/security-headers.ts),
  // which an HTML file built ahead of time could not.
  await connection();
  return (
    // The browser shows every moment in the zone the server does (src/lib/format.ts `displayTimeZone`).
    <html lang="en" className={inter.variable} data-time-zone={displayTimeZone()}>
      <body className="min-h-screen font-sans antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
