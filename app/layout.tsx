import type { Metadata, Viewport } from "next";
import { headers } from "next/headers";
import type { ReactNode } from "react";
import { bodyFont, figuresFont } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Benchtag", template: "%s · Benchtag" },
  description: "Workshop records for engine builds, from intake to handover.",
  manifest: "/manifest.webmanifest",
  applicationName: "Benchtag",
  appleWebApp: { capable: true, title: "Benchtag", statusBarStyle: "default" },
  icons: { icon: "/icons/icon-192.png", apple: "/icons/icon-192.png" },
};

export const viewport: Viewport = {
  themeColor: "#161b20",
  width: "device-width",
  initialScale: 1,
};

// The service worker is registered by the bench's own layout (app/bench/layout.tsx), not here.
// Every page is rendered per request (reading the request's headers does that), so each gets the
// nonce of its own Content-Security-Policy (proxy.ts) on its scripts. Only /offline is built once:
// it is plain HTML that needs no script.
export default async function RootLayout({ children }: { children: ReactNode }) {
  await headers();
  return (
    <html lang="en" className={`${bodyFont.variable} ${figuresFont.variable}`}>
      <body className="min-h-screen">{children}</body>
    </html>
  );
}
