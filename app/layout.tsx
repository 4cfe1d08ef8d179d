import type { Metadata } from "next";
import { connection } from "next/server";
import { ZodJitless } from "@/components/zod-jitless";
import { inter, mono } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Plateau", template: "%s · Plateau" },
  description: "Plan on-chip wiring across process nodes: R, C, delay, repeaters and energy per wire class.",
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page renders per request: its scripts carry the request's CSP nonce (proxy.ts), which a page
  // prerendered at build time could not.
  await connection();
  return (
    <html lang="en" className={`${inter.variable} ${mono.variable}`}>
      <body className="min-h-screen font-sans antialiased">
        <ZodJitless />
        {children}
      </body>
    </html>
  );
}
