// The security headers of every answer (set by proxy.ts). Pure: no Next, no I/O, so the unit tests check the policy itself.

export interface SecurityHeaderOptions {
  /** "page": HTML (and the RSC payloads of client navigation); "api": JSON, CSV and PDF answers of /api. */
  kind: "page" | "api";
  /** The per-request nonce of a page's scripts and styles (Next reads it from the request's CSP header). */
  nonce?: string;
  /** `next dev`: React needs eval for its error overlay and Next injects unnonced styles. */
  dev: boolean;
  /** A share link's page or JSON (/r/…, /api/share/…): read-only, its token in the path, so no referrer at all. */
  share?: boolean;
  /** Served over HTTPS in production (PLATEAU_PUBLIC_URL starts with https:): HSTS and upgrade-insecure-requests. */
  https: boolean;
}

/** One year, as the HSTS preload list asks (https://hstspreload.org/#deployment-recommendations). */
export const HSTS_MAX_AGE_S = 31_536_000;

/**
 * Referrer-Policy: strict-origin-when-cross-origin (OWASP Secure Headers Project's recommendation). Share and
 * invite links carry their token in the path; this policy sends other sites only our origin, never the path, and
 * nothing at all from HTTPS to HTTP. "no-referrer" would be no safer for the token and would break our own writes:
 * under it browsers send `Origin: null` on same-origin POSTs (Fetch standard, "append a request Origin header"),
 * which the Origin check in lib/api.ts rejects. The share pages (/r/…), which send nothing, use "no-referrer".
 */
export const REFERRER_POLICY = "strict-origin-when-cross-origin";

/** Browser features Plateau never uses, switched off for the page and anything it might embed. */
export const PERMISSIONS_POLICY = [
  "accelerometer=()",
  "autoplay=()",
  "browsing-topics=()",
  "camera=()",
  "display-capture=()",
  "geolocation=()",
  "gyroscope=()",
  "magnetometer=()",
  "microphone=()",
  "midi=()",
  "payment=()",
  "publickey-credentials-get=()",
  "serial=()",
  "usb=()",
  "xr-spatial-tracking=()",
].join(", ");

/**
 * The Content-Security-Policy of a page (nonce-based, Next's recipe: node_modules/next/dist/docs/01-app/02-guides/
 * content-security-policy.md) or of an API answer (nothing may load or frame it).
 *
 * - script-src: only scripts carrying this request's nonce, and what they load ('strict-dynamic': Next's chunks).
 * - style-src: our stylesheets and nonced <style>; style-src-attr 'unsafe-inline' admits style="" attributes,
 *   which React renders for the charts (@visx: positions, sizes, colours) and the layout. An attribute cannot load
 *   anything, hold a selector or run script, so this keeps the policy's protection against injected <style> sheets.
 * - worker-src 'self': the engine and the CSV preview run in Web Workers built from our own /_next/static files.
 * - img-src data: blob: for inline SVG data URIs and generated images; fonts are self-hosted (next/font/local).
 * - frame-ancestors 'none' (with X-Frame-Options DENY for older browsers), object-src 'none', base-uri 'none',
 *   form-action 'self'.
 */
export function contentSecurityPolicy(o: SecurityHeaderOptions): string {
  if (o.kind === "api") {
    return "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'";
  }
  const nonce = o.nonce ? ` 'nonce-${o.nonce}'` : "";
  const directives = [
    "default-src 'self'",
    `script-src 'self'${nonce} 'strict-dynamic'${o.dev ? " 'unsafe-eval'" : ""}`,
    // In development Next injects <style> elements without a nonce (hot reload), so styles are looser there only.
    `style-src 'self'${o.dev ? " 'unsafe-inline'" : nonce}`,
    "style-src-attr 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "worker-src 'self' blob:",
    "manifest-src 'self'",
    "frame-src 'none'",
    "object-src 'none'",
    "base-uri 'none'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ];
  if (o.https) directives.push("upgrade-insecure-requests");
  return directives.join("; ");
}

/** Every security header of an answer (header names in lower case). */
export function securityHeaders(o: SecurityHeaderOptions): Record<string, string> {
  const h: Record<string, string> = {
    "content-security-policy": contentSecurityPolicy(o),
    "x-frame-options": "DENY",
    "x-content-type-options": "nosniff",
    "referrer-policy": o.share ? "no-referrer" : REFERRER_POLICY,
    "permissions-policy": PERMISSIONS_POLICY,
    "cross-origin-opener-policy": "same-origin",
  };
  if (o.https && !o.dev) h["strict-transport-security"] = `max-age=${HSTS_MAX_AGE_S}; includeSubDomains`;
  return h;
}

/** A fresh nonce: 128 random bits, base64 (Web Crypto, so it works in any runtime). */
export function newNonce(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return btoa(String.fromCharCode(...bytes));
}

/** Production over HTTPS: PLATEAU_PUBLIC_URL starts with https: (read at request time, not at build time). */
export function servedOverHttps(env: { NODE_ENV?: string; PLATEAU_PUBLIC_URL?: string }): boolean {
  return env.NODE_ENV === "production" && /^https:\/\//i.test(env.PLATEAU_PUBLIC_URL?.trim() ?? "");
}
