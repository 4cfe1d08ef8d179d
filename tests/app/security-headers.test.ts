import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { Client, userWithTeam } from "../helpers/http";
import { startServer, type RunningServer } from "../helpers/next-server";
import { makeWorkspace } from "../helpers/reports";

// Issue 12, finding 4: security headers on every HTML and API answer (proxy.ts, lib/security-headers.ts), checked
// against OWASP ASVS 4.0.3 14.4.3 (a Content-Security-Policy), 14.4.4 (X-Content-Type-Options: nosniff), 14.4.5
// (Strict-Transport-Security), 14.4.6 (a suitable Referrer-Policy) and 14.4.7 (no framing by other sites:
// frame-ancestors and X-Frame-Options). That the policy breaks nothing in a browser: tests/e2e/csp.test.ts.

const NONCE = /script-src 'self' 'nonce-([A-Za-z0-9+/=]{22,})' 'strict-dynamic'/;

function commonHeaders(h: Headers) {
  expect(h.get("x-frame-options")).toBe("DENY"); // ASVS 14.4.7
  expect(h.get("x-content-type-options")).toBe("nosniff"); // ASVS 14.4.4
  expect(h.get("permissions-policy")).toContain("camera=()");
  expect(h.get("permissions-policy")).toContain("geolocation=()");
  expect(h.get("permissions-policy")).toContain("microphone=()");
}

function pagePolicy(h: Headers): string {
  const csp = h.get("content-security-policy") ?? "";
  expect(csp).toMatch(NONCE); // ASVS 14.4.3
  for (const d of ["default-src 'self'", "object-src 'none'", "base-uri 'none'", "frame-ancestors 'none'", "form-action 'self'", "worker-src 'self' blob:"]) {
    expect(csp).toContain(d);
  }
  expect(csp).not.toContain("unsafe-eval");
  expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
  return csp;
}

describe("security headers (server with an http PLATEAU_PUBLIC_URL)", () => {
  it("an HTML page: a nonce-based CSP with a fresh nonce per request that every script carries, no framing, nosniff, referrer policy, no HSTS", async () => {
    const o = await userWithTeam("Header Team");
    const seen = new Set<string>();
    for (const path of ["/sign-in", "/sign-in", "/", `/teams/${o.teamId}`, "/help/csv", "/no-such-page"]) {
      const r = path.startsWith("/teams") ? await o.client.get(path) : await new Client().get(path);
      expect(r.status, path).toBe(path === "/no-such-page" ? 404 : 200);
      const csp = pagePolicy(r.headers);
      commonHeaders(r.headers);
      expect(r.headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin"); // ASVS 14.4.6
      expect(r.headers.get("strict-transport-security")).toBeNull(); // not over HTTPS
      expect(csp).not.toContain("upgrade-insecure-requests");
      const nonce = NONCE.exec(csp)![1]!;
      seen.add(nonce);
      const scripts = [...r.text.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
      expect(scripts.length, path).toBeGreaterThan(0);
      for (const s of scripts) expect(s, `${path}: ${s}`).toContain(`nonce="${nonce}"`);
    }
    expect(seen.size).toBe(6);
  });

  it("a nonce or policy sent by the client is not used", async () => {
    const r = await new Client().req("GET", "/sign-in", undefined, {
      headers: { "x-nonce": "attacker", "content-security-policy": "script-src 'nonce-attacker'" },
    });
    expect(r.status).toBe(200);
    expect(r.text).not.toContain("attacker");
    expect(r.headers.get("content-security-policy")).not.toContain("attacker");
  });

  it("API answers (JSON, errors, CSV): a policy that loads and frames nothing, with the same headers", async () => {
    const o = await userWithTeam("Header API");
    const ws = await makeWorkspace(o.client, o.teamId);
    const answers = [
      await new Client().get("/api/health"),
      await new Client().get("/api/me"), // 401
      await o.client.post(`/api/teams/${o.teamId}/baselines`, { name: "" }), // 400
      await o.client.get(`/api/baselines/${ws.baselineId}/export.csv`),
    ];
    expect(answers.map((a) => a.status)).toEqual([200, 401, 400, 200]);
    for (const a of answers) {
      expect(a.headers.get("content-security-policy")).toBe("default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'");
      commonHeaders(a.headers);
      expect(a.headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
      expect(a.headers.get("strict-transport-security")).toBeNull();
    }
  });

  it("the share link, its page and its JSON send no referrer at all (the token is in the path)", async () => {
    const o = await userWithTeam("Header Share");
    const ws = await makeWorkspace(o.client, o.teamId);
    const report = await o.client.post(`/api/teams/${o.teamId}/reports`, { baselineId: ws.baselineId, scenarioIds: ws.scenarioIds, title: "Shared headers" });
    expect(report.status, report.text).toBe(201);
    const link = await o.client.post(`/api/reports/${report.json.report.id}/share-links`, {});
    expect(link.status, link.text).toBe(201);
    const token = String(link.json.url).split("/r/")[1]!;
    const anon = new Client();
    const hop = await anon.get(`/r/${token}`);
    expect(hop.status).toBe(303);
    const page = await anon.get(`/r/${token}/report`);
    expect(page.status).toBe(200);
    pagePolicy(page.headers);
    const api = await anon.get(`/api/share/${token}`);
    expect(api.status).toBe(200);
    const gone = await anon.get(`/r/${"x".repeat(43)}`);
    expect(gone.status).toBe(404);
    for (const r of [hop, page, api, gone]) {
      commonHeaders(r.headers);
      expect(r.headers.get("referrer-policy")).toBe("no-referrer");
    }
    // The unknown link's page (a route handler's own HTML) styles itself with a <style> carrying the request's nonce.
    const nonce = NONCE.exec(gone.headers.get("content-security-policy") ?? "")![1]!;
    expect(gone.text).toContain(`<style nonce="${nonce}">`);
  });

  it("the build's static files are nosniff too", async () => {
    const html = (await new Client().get("/sign-in")).text;
    const src = /<script[^>]+src="(\/_next\/static\/[^"]+\.js)"/.exec(html)?.[1];
    expect(src).toBeTruthy();
    const r = await fetch(inject("baseUrl") + src);
    expect(r.status).toBe(200);
    expect(r.headers.get("x-content-type-options")).toBe("nosniff");
  });
});

describe("security headers in production over HTTPS (PLATEAU_PUBLIC_URL https://…)", () => {
  let https: RunningServer;
  beforeAll(async () => {
    https = await startServer((base) => ({ PLATEAU_PUBLIC_URL: base.replace(/^http:/, "https:") }));
  });
  afterAll(async () => {
    await https?.stop();
  });

  it("adds Strict-Transport-Security (one year, subdomains) to pages and API answers, and upgrade-insecure-requests to the page policy", async () => {
    const page = await fetch(`${https.baseUrl}/sign-in`);
    const api = await fetch(`${https.baseUrl}/api/me`); // 401 through apiRoute
    expect(api.status).toBe(401);
    for (const r of [page, api]) expect(r.headers.get("strict-transport-security")).toBe("max-age=31536000; includeSubDomains"); // ASVS 14.4.5
    expect(page.headers.get("content-security-policy")).toContain("upgrade-insecure-requests");
    expect(api.headers.get("content-security-policy")).not.toContain("upgrade-insecure-requests");
  });
});
