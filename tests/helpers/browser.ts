import { chromium, type Browser, type BrowserContext } from "playwright-core";
import type { Client } from "./http";

/** Headless Debian Chromium as the browser tests run it (`CHROMIUM_PATH` overrides the binary). */
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH || "/usr/bin/chromium",
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"],
  });
}

/** A browser context signed in as `client` (its session cookie set for `baseUrl`). */
export async function signedInContext(browser: Browser, client: Client, baseUrl: string, viewport: { width: number; height: number }): Promise<BrowserContext> {
  const ctx = await browser.newContext({ viewport });
  const [name, value] = client.cookie.split("=");
  await ctx.addCookies([{ name: name!, value: value!, url: baseUrl }]);
  return ctx;
}
