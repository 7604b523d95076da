import type { Metadata, Viewport } from "next";
import localFont from "next/font/local";
import { connection } from "next/server";
import "./globals.css";

// Shipped with the app from the npm font package: nothing is fetched at build or run time.
const dentateFont = localFont({
  src: [
    { path: "../node_modules/@fontsource-variable/atkinson-hyperlegible-next/files/atkinson-hyperlegible-next-latin-wght-normal.woff2", style: "normal", weight: "200 800" },
    { path: "../node_modules/@fontsource-variable/atkinson-hyperlegible-next/files/atkinson-hyperlegible-next-latin-wght-italic.woff2", style: "italic", weight: "200 800" },
  ],
  variable: "--font-dentate",
  display: "swap",
});

export const metadata: Metadata = {
  title: { default: "Dentate", template: "%s · Dentate" },
  description: "Lesion maps and follow-up registry for anal precancer clinics.",
};

export const viewport: Viewport = { width: "device-width", initialScale: 1 };

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page is rendered per request, so Next can put that request's CSP nonce (proxy.ts) on
  // its scripts; a page prerendered at build time would carry none and its scripts would be blocked.
  await connection();
  return (
    <html lang="en" className={dentateFont.variable}>
      <body className="min-h-screen font-sans antialiased">{children}</body>
    </html>
  );
}
