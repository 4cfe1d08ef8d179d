import fs from "node:fs";
import { describe, expect, it } from "vitest";
import { signedUpClient, userWithTeam, type Client } from "../helpers/http";
import { makeWorkspace } from "../helpers/reports";
import { addMember } from "./workspace-helpers";

// Issue 12 finding 11: PDF rendering is bounded — PLATEAU_PDF_CONCURRENCY (default 1) at once, PLATEAU_PDF_QUEUE
// (default 2) waiting, 2 per user at a time; beyond that 429 with Retry-After (RFC 9110 §10.2.3, RFC 6585 §4); a
// client that goes away frees its place. The test server runs with the defaults.
const HAS_CHROMIUM = fs.existsSync(process.env.PLATEAU_CHROMIUM ?? "/usr/bin/chromium");

async function reportAndViewers(n: number) {
  const owner = await userWithTeam("PDF Team");
  const ws = await makeWorkspace(owner.client, owner.teamId);
  const r = await owner.client.post(`/api/teams/${owner.teamId}/reports`, {
    baselineId: ws.baselineId,
    scenarioIds: ws.scenarioIds.slice(0, 2),
    title: "Bounded PDF",
  });
  expect(r.status, r.text).toBe(201);
  const viewers: Client[] = [];
  for (let i = 0; i < n; i++) {
    const v = await signedUpClient(`Viewer ${i}`);
    addMember(owner.teamId, v.userId, "viewer");
    viewers.push(v.client);
  }
  return { id: r.json.report.id as string, owner: owner.client, viewers };
}

async function pdf(c: Client, id: string, signal?: AbortSignal) {
  const res = await fetch(`${c.baseUrl}/api/reports/${id}/pdf`, { headers: { cookie: c.cookie }, signal });
  const body = Buffer.from(await res.arrayBuffer());
  return { status: res.status, retryAfter: res.headers.get("retry-after"), type: res.headers.get("content-type"), body };
}

describe.skipIf(!HAS_CHROMIUM)("GET /api/reports/[id]/pdf under load (issue 12 finding 11)", () => {
  it("six users at once: three are served (1 rendering + 2 queued), three get 429 busy with Retry-After", async () => {
    const { id, viewers } = await reportAndViewers(6);
    const answers = await Promise.all(viewers.map((v) => pdf(v, id)));
    const ok = answers.filter((a) => a.status === 200);
    const busy = answers.filter((a) => a.status === 429);
    expect(answers.map((a) => a.status).sort()).toEqual([200, 200, 200, 429, 429, 429]);
    for (const a of ok) {
      expect(a.type).toBe("application/pdf");
      expect(a.body.subarray(0, 5).toString()).toBe("%PDF-");
    }
    for (const a of busy) {
      expect(a.retryAfter).toMatch(/^[1-9]\d*$/);
      expect(JSON.parse(a.body.toString()).error).toMatchObject({ code: "busy", message: expect.stringMatching(/^Too many PDFs/) });
    }
  }, 120_000);

  it("one user asking three times at once gets two made and one 429 rate_limited", async () => {
    const { id, owner } = await reportAndViewers(0);
    const answers = await Promise.all([pdf(owner, id), pdf(owner, id), pdf(owner, id)]);
    expect(answers.map((a) => a.status).sort()).toEqual([200, 200, 429]);
    const limited = answers.find((a) => a.status === 429)!;
    expect(limited.retryAfter).toMatch(/^[1-9]\d*$/);
    expect(JSON.parse(limited.body.toString()).error.code).toBe("rate_limited");
  }, 120_000);

  it("clients that go away free their places: after three abandon a full queue, three others are all served", async () => {
    const { id, viewers } = await reportAndViewers(6);
    const ctl = new AbortController();
    const abandoned = viewers.slice(0, 3).map((v) => pdf(v, id, ctl.signal).catch((e: Error) => e.name));
    // the three fill the renderer and its queue; then their clients disconnect
    await new Promise((r) => setTimeout(r, 1200));
    ctl.abort();
    expect(await Promise.all(abandoned)).toEqual(["AbortError", "AbortError", "AbortError"]);
    // the server notices the closed connections (request.signal): the queued two leave at once, the render is stopped.
    // 3 s is well under the ≥ 7.8 s the three renders would hold the places if they ran to the end (2.6 s each, idle).
    await new Promise((r) => setTimeout(r, 3000));
    const answers = await Promise.all(viewers.slice(3).map((v) => pdf(v, id)));
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200]);
  }, 120_000);
});
