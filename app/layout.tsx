import "@fontsource/roboto/400.css";
import "@fontsource/roboto/500.css";
import "@fontsource/roboto/700.css";
import "./globals.css";
import type { Metadata, Viewport } from "next";
import { connection } from "next/server";
import { Toaster } from "@/components/ui/toaster";

export const metadata: Metadata = {
  title: { default: "Sluice", template: "%s · Sluice" },
  description: "Fleet registry for edge data reduction",
};

export const viewport: Viewport = { width: "device-width", initialScale: 1 };

// Every page renders per request, so Next can put the request's CSP nonce (proxy.ts) on
// its scripts; a page prerendered at build time would carry none and not hydrate.
export default async function RootLayout({ children }: Readonly<{ children: React.ReactNode }>) {
  await connection();
  return (
    <html lang="en">
      <body className="min-h-screen">
        {children}
        <Toaster />
      </body>
    </html>
  );
}
