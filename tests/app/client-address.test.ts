import http from "node:http";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeWorkspace } from "../helpers/reports";
import { Client, GOOD_PASSWORD, uniqueEmail, verifyEmail } from "../helpers/http";
import { startServer, type RunningServer } from "../helpers/next-server";

// A second server of its own, as a deployment WITHOUT a proxy in front runs: no PLATEAU_TRUSTED_PROXIES and no
// PLATEAU_PUBLIC_URL. (The shared test server trusts the loopback test client as its proxy.)
let server: RunningServer;
beforeAll(async () => {
  server = await startServer({ PLATEAU_TRUSTED_PROXIES: undefined, PLATEAU_PUBLIC_URL: undefined });
}, 120_000);
afterAll(() => server?.stop());

const signIn = (email: string, password: string, xff?: string) =>
  new Client(server.baseUrl).req("POST", "/api/auth/sign-in", { email, password }, { headers: xff ? { "x-forwarded-for": xff } : {} });

describe("issue 12 finding 1: the client address comes from the socket unless a proxy is trusted", () => {
  it("after 20 failures from one client, a spoofed X-Forwarded-For does not get it past the limit", async () => {
    const c = new Client(server.baseUrl);
    const email = uniqueEmail("victim");
    expect((await c.post("/api/auth/sign-up", { email, password: GOOD_PASSWORD, name: "V" })).status).toBe(201);
    // Password spraying from one machine, rotating the header: before the fix each value was a new client.
    const statuses: number[] = [];
    for (let i = 0; i < 20; i++) statuses.push((await signIn(uniqueEmail("spray"), "wrong password 1", `198.51.100.${i + 1}`)).status);
    expect(statuses.slice(0, 19).every((s) => s === 401)).toBe(true);
    expect(statuses[19]).toBe(429);
    // Used to answer 200: the same client claiming to be 198.51.100.8.
    const spoofed = await signIn(email, GOOD_PASSWORD, "198.51.100.8");
    expect(spoofed.status).toBe(429);
    expect(spoofed.json.error.code).toBe("too_many_attempts");
    const noHeader = await signIn(email, GOOD_PASSWORD);
    expect(noHeader.status).toBe(429);
  });

  it("warns at start-up when PLATEAU_PUBLIC_URL is not set in production (issue 12 finding 7)", () => {
    expect(server.log()).toMatch(/\[plateau\] PLATEAU_PUBLIC_URL is not set/);
  });
});

describe("issue 12 finding 7 / issue 13 item 1: without PLATEAU_PUBLIC_URL links use the listen address, never the Host header", () => {
  it("an invite and a share link made with a forged Host and X-Forwarded-Host carry the listen address", async () => {
    const owner = new Client(server.baseUrl);
    const ownerEmail = uniqueEmail("own");
    expect((await owner.post("/api/auth/sign-up", { email: ownerEmail, password: GOOD_PASSWORD, name: "O" })).status).toBe(201);
    // invites need a confirmed address (issue 12 finding 6): confirmed through the link this server mailed
    await verifyEmail(owner, ownerEmail, server.dbPath);
    const t = await owner.post("/api/teams", { name: "Link Team" });
    expect(t.status).toBe(201);
    const teamId = t.json.team.id as string;
    const forged = { host: "evil.example", "x-forwarded-host": "evil.example", "x-forwarded-proto": "https" };
    // Without an Origin header (a script, or a proxy passing the client's Host on): accepted, but the link is ours.
    const inv = await rawRequest("POST", `/api/teams/${teamId}/invites`, { ...forged, cookie: owner.cookie }, { email: uniqueEmail("inv"), role: "viewer" });
    expect(inv.status, inv.text).toBe(201);
    const db = new Database(server.dbPath, { readonly: true });
    try {
      const body = (db.prepare("select text_body from outbox where id = ?").get(inv.json.mail.outboxId) as { text_body: string }).text_body;
      // Used to read https://evil.example/invite/<token>.
      expect(body).toContain(`${server.baseUrl}/invite/`);
      expect(body).not.toContain("evil.example");
    } finally {
      db.close();
    }
    const ws = await makeWorkspace(owner, teamId);
    const rep = await owner.post(`/api/teams/${teamId}/reports`, { baselineId: ws.baselineId, scenarioIds: ws.scenarioIds, title: "Link host" });
    expect(rep.status, rep.text).toBe(201);
    const link = await rawRequest("POST", `/api/reports/${rep.json.report.id}/share-links`, { ...forged, host: "localhost:1", cookie: owner.cookie }, {});
    expect(link.status, link.text).toBe(201);
    // Issue 13 item 1: the share link is built like invite links (the listen address here: -H 127.0.0.1).
    expect(link.json.url).toMatch(new RegExp(`^${server.baseUrl.replace(/\./g, "\\.")}/r/[A-Za-z0-9_-]+$`));
  });

  it("a browser write whose Origin does not match the Host it reached is refused", async () => {
    const c = new Client(server.baseUrl);
    expect((await c.post("/api/auth/sign-up", { email: uniqueEmail("o"), password: GOOD_PASSWORD, name: "O" })).status).toBe(201);
    const r = await rawRequest("POST", "/api/teams", { host: "evil.example", origin: server.baseUrl, cookie: c.cookie }, { name: "X" });
    expect(r.status).toBe(403);
    const https = await c.req("POST", "/api/teams", { name: "Y" }, { headers: { origin: server.baseUrl.replace("http:", "https:") } });
    expect(https.status).toBe(403);
    expect((await c.post("/api/teams", { name: "Z" })).status).toBe(201);
  });
});

/** A request with headers fetch() will not send (Host). */
function rawRequest(method: string, path: string, headers: Record<string, string>, body?: unknown): Promise<{ status: number; text: string; json: any }> {
  const url = new URL(server.baseUrl);
  const payload = body === undefined ? undefined : JSON.stringify(body);
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: url.hostname,
        port: url.port,
        method,
        path,
        headers: { ...headers, ...(payload ? { "content-type": "application/json", "content-length": String(Buffer.byteLength(payload)) } : {}) },
      },
      (res) => {
        let text = "";
        res.setEncoding("utf8");
        res.on("data", (d) => (text += d));
        res.on("end", () => {
          let json: any;
          try {
            json = JSON.parse(text);
          } catch {
            json = undefined;
          }
          resolve({ status: res.statusCode ?? 0, text, json });
        });
      },
    );
    req.on("error", reject);
    req.end(payload);
  });
}
