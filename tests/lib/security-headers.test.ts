import { describe, expect, it } from "vitest";
import { contentSecurityPolicy, newNonce, securityHeaders, servedOverHttps } from "@/lib/security-headers";

// The header policy of issue 12, finding 4 (OWASP ASVS 4.0.3 14.4.3–14.4.7). The served headers:
// tests/app/security-headers.test.ts; the browser check: tests/e2e/csp.test.ts.

describe("security headers", () => {
  it("a page's CSP admits only the nonce's scripts (and what they load), no eval, no framing, no plugins, no <base>", () => {
    const csp = contentSecurityPolicy({ kind: "page", nonce: "abc123", dev: false, https: false });
    const d = Object.fromEntries(csp.split("; ").map((x) => [x.split(" ")[0], x.split(" ").slice(1).join(" ")]));
    expect(d["script-src"]).toBe("'self' 'nonce-abc123' 'strict-dynamic'");
    expect(d["style-src"]).toBe("'self' 'nonce-abc123'");
    expect(d["style-src-attr"]).toBe("'unsafe-inline'");
    expect(d["object-src"]).toBe("'none'");
    expect(d["base-uri"]).toBe("'none'");
    expect(d["frame-ancestors"]).toBe("'none'");
    expect(d["worker-src"]).toBe("'self' blob:");
    expect(csp).not.toContain("unsafe-eval");
    expect("upgrade-insecure-requests" in d).toBe(false);
  });

  it("development adds eval and unnonced styles (React's overlay, hot reload); HTTPS adds upgrade-insecure-requests", () => {
    const dev = contentSecurityPolicy({ kind: "page", nonce: "n", dev: true, https: false });
    expect(dev).toContain("script-src 'self' 'nonce-n' 'strict-dynamic' 'unsafe-eval'");
    expect(dev).toContain("style-src 'self' 'unsafe-inline'");
    expect(contentSecurityPolicy({ kind: "page", nonce: "n", dev: false, https: true })).toMatch(/; upgrade-insecure-requests$/);
  });

  it("API answers load and frame nothing", () => {
    expect(contentSecurityPolicy({ kind: "api", dev: false, https: true })).toBe(
      "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'",
    );
  });

  it("HSTS only in production over HTTPS; share pages send no referrer", () => {
    expect(securityHeaders({ kind: "page", nonce: "n", dev: false, https: false })["strict-transport-security"]).toBeUndefined();
    expect(securityHeaders({ kind: "api", dev: false, https: true })["strict-transport-security"]).toBe("max-age=31536000; includeSubDomains");
    expect(securityHeaders({ kind: "page", dev: false, https: false })["referrer-policy"]).toBe("strict-origin-when-cross-origin");
    expect(securityHeaders({ kind: "page", dev: false, https: false, share: true })["referrer-policy"]).toBe("no-referrer");
    expect(servedOverHttps({ NODE_ENV: "production", PLATEAU_PUBLIC_URL: "https://plateau.example" })).toBe(true);
    expect(servedOverHttps({ NODE_ENV: "production", PLATEAU_PUBLIC_URL: "http://plateau.example" })).toBe(false);
    expect(servedOverHttps({ NODE_ENV: "production" })).toBe(false);
    expect(servedOverHttps({ NODE_ENV: "development", PLATEAU_PUBLIC_URL: "https://plateau.example" })).toBe(false);
  });

  it("nonces are 128 random bits, fresh each time", () => {
    const a = newNonce();
    expect(Buffer.from(a, "base64")).toHaveLength(16);
    expect(new Set(Array.from({ length: 50 }, newNonce)).size).toBe(50);
  });
});
