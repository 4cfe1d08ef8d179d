import { NextResponse, type NextRequest } from "next/server";
import { newNonce, securityHeaders, servedOverHttps } from "@/lib/security-headers";

/**
 * Next 16's proxy (the former middleware): the security headers of every page, with a fresh CSP nonce. Next reads the
 * nonce from the request's Content-Security-Policy header and puts it on its own scripts and styles (which is why
 * every page renders per request: app/layout.tsx awaits connection()). Our own inline markup reads it from `x-nonce`
 * (app/r/[token]/route.ts). API answers get their headers from next.config.ts: a proxy makes Next buffer the request
 * body for it, which the streamed CSV imports must not suffer.
 */
export function proxy(req: NextRequest) {
  const path = req.nextUrl.pathname;
  const nonce = newNonce();
  const headers = securityHeaders({
    kind: "page",
    nonce,
    share: path.startsWith("/r/"),
    dev: process.env.NODE_ENV === "development",
    https: servedOverHttps(process.env),
  });
  const requestHeaders = new Headers(req.headers);
  // Never trust a client's own nonce or policy.
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("content-security-policy", headers["content-security-policy"]!);
  const res = NextResponse.next({ request: { headers: requestHeaders } });
  for (const [name, value] of Object.entries(headers)) res.headers.set(name, value);
  return res;
}

export const config = {
  // Every page, not the API (next.config.ts) nor the build's static files (hashed JS, CSS, fonts and the workers'
  // scripts: a page policy on a worker script would become the worker's own).
  matcher: ["/((?!api|_next/static|_next/image).*)"],
};
