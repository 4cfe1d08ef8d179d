import type { Metadata } from "next";
import { inter, mono } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Plateau", template: "%s · Plateau" },
  description: "Plan on-chip wiring across process nodes: R, C, delay, repeaters and energy per wire class.",
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${inter.variable} ${mono.variable}`}>
      <body className="min-h-screen font-sans antialiased">{children}</body>
    </html>
  );
}
