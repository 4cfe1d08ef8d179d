import { NextResponse, type NextRequest } from "next/server";
import { newNonce, securityHeaders, servedOverHttps } from "@/lib/security-headers";

/**
 * Next 16's proxy (the former middleware): the security headers of every answer, and for pages a fresh CSP nonce.
 * Next reads the nonce from the request's Content-Security-Policy header and puts it on its own scripts and styles
 * (which is why every page renders per request: app/layout.tsx awaits connection()). Our own inline markup reads
 * it from `x-nonce` (app/r/[token]/route.ts).
 */
export function proxy(req: NextRequest) {
  const path = req.nextUrl.pathname;
  const api = path === "/api" || path.startsWith("/api/");
  const nonce = api ? undefined : newNonce();
  const headers = securityHeaders({
    kind: api ? "api" : "page",
    nonce,
    share: path.startsWith("/r/") || path.startsWith("/api/share/"),
    dev: process.env.NODE_ENV === "development",
    https: servedOverHttps(process.env),
  });
  const requestHeaders = new Headers(req.headers);
  // Never trust a client's own x-nonce.
  requestHeaders.delete("x-nonce");
  if (nonce) {
    requestHeaders.set("x-nonce", nonce);
    requestHeaders.set("content-security-policy", headers["content-security-policy"]!);
  }
  const res = NextResponse.next({ request: { headers: requestHeaders } });
  for (const [name, value] of Object.entries(headers)) res.headers.set(name, value);
  return res;
}

export const config = {
  // Everything except the build's static files (hashed JS, CSS, fonts and the workers' scripts: a page CSP on a
  // worker script would become the worker's own policy). Those get nosniff from next.config.ts.
  matcher: ["/((?!_next/static|_next/image).*)"],
};
