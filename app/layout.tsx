import type { Metadata, Viewport } from "next";
import type { ReactNode } from "react";
import { bodyFont, figuresFont } from "./fonts";
import "./globals.css";
import { ServiceWorkerStatus } from "./ui/service-worker-status";

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

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${bodyFont.variable} ${figuresFont.variable}`}>
      <body className="min-h-screen">
        {children}
        <ServiceWorkerStatus />
      </body>
    </html>
  );
}
