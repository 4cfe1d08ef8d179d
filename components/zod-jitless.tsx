"use client";
import { config } from "zod/v4/core";

// zod 4 probes `new Function("")` on its first object parse to decide whether to compile fast parsers. The page's
// Content-Security-Policy (proxy.ts) has no 'unsafe-eval', so the probe would be blocked and reported as a CSP
// violation even though zod catches it. In the browser, zod runs without that probe (and without compiled parsers);
// the server (where this module is also evaluated for rendering) keeps them.
if (typeof window !== "undefined") config({ jitless: true });

/** Loaded by the root layout so the setting is in place before any client-side parse. Renders nothing. */
export function ZodJitless() {
  return null;
}
