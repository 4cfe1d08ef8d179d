import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import Database from "better-sqlite3";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { launchBrowser } from "../helpers/browser";
import { openDatabase } from "@/db/connect";
import { seedDemoWorkspace } from "@/lib/demo/seed-workspace";

// Issue 12, finding 4: the Content-Security-Policy (proxy.ts, lib/security-headers.ts) must break nothing. The whole
// practitioner's path runs in Chromium with a listener for CSP violations (the `securitypolicyviolation` event, W3C
// CSP Level 3 §5.5) and for console errors and uncaught page errors: any of them fails the test.

const PASSWORD = "lamina copper trench 9";
let browser: Browser;
let baseUrl: string;

beforeAll(async () => {
  baseUrl = inject("baseUrl");
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

interface Watch {
  problems: string[];
}

/**
 * Record every CSP violation, console error and uncaught error of the context's pages. `expectErrorStatus`: the
 * pages answer 4xx on purpose, so Chromium's "Failed to load resource" console line for them is expected.
 */
async function watched(ctx: BrowserContext, watch: Watch, expectErrorStatus = false): Promise<void> {
  await ctx.exposeBinding("__reportCspViolation", (_src, text: string) => {
    watch.problems.push(`CSP violation: ${text}`);
  });
  // Injected by the browser driver (not subject to the page's policy), before any page script runs.
  await ctx.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (e) => {
      const report = (window as unknown as { __reportCspViolation: (t: string) => void }).__reportCspViolation;
      report(`${e.violatedDirective} blocked ${e.blockedURI || "inline"} at ${e.sourceFile}:${e.lineNumber}`);
    });
  });
  ctx.on("page", (page) => listen(page, watch, expectErrorStatus));
}

function listen(page: Page, watch: Watch, expectErrorStatus: boolean): void {
  // Chromium's "Failed to load resource" line does not say which resource: name the answers of 400 and up beside it.
  const failed: string[] = [];
  page.on("response", (r) => {
    if (r.status() >= 400) failed.push(`${r.status()} ${r.request().method()} ${r.url()}`);
  });
  page.on("console", (m) => {
    if (m.type() !== "error") return;
    if (expectErrorStatus && /^Failed to load resource: the server responded with a status of 4\d\d/.test(m.text())) return;
    const which = /^Failed to load resource/.test(m.text()) && failed.length ? ` (answers ≥ 400 so far: ${failed.join(", ")})` : "";
    watch.problems.push(`console error on ${page.url()}: ${m.text()}${which}`);
  });
  page.on("pageerror", (e) => watch.problems.push(`page error on ${page.url()}: ${String(e)}`));
}

async function waitForResults(page: Page) {
  await page.waitForSelector("[data-testid=results-table]");
  await page.waitForFunction(
    () => {
      const r = document.querySelector("[data-results-key]")?.getAttribute("data-results-key");
      const s = document.querySelector("[data-sweep-key]")?.getAttribute("data-sweep-key");
      return !!r && r === s && document.querySelectorAll(".sweep-chart path").length > 0;
    },
    undefined,
    { timeout: 30_000 },
  );
}

describe("Content-Security-Policy in the browser", () => {
  it("sign-up, team, CSV import preview, the editor with its workers and charts, the field check, a report, its PDF and share page: no CSP violation, no console error", async () => {
    const watch: Watch = { problems: [] };
    const ctx = await browser.newContext({ baseURL: baseUrl, viewport: { width: 1440, height: 1000 }, acceptDownloads: true });
    await watched(ctx, watch);
    const page = await ctx.newPage();

    // Sign up and create a team through the forms.
    const email = `csp-${Date.now().toString(36)}@example.test`;
    const first = await page.goto("/sign-up");
    const csp = first?.headers()["content-security-policy"] ?? "";
    expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{20,}' 'strict-dynamic'/);
    expect(csp).not.toContain("unsafe-eval");
    await page.getByLabel("Name").fill("Casey Policy");
    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Password").fill(PASSWORD);
    await page.getByRole("button", { name: "Create account" }).click();
    await page.waitForURL(/\/teams(\?landing=1)?$/);
    await page.getByLabel("Team name").fill("Policy Wiring");
    await page.getByRole("button", { name: "Create team" }).click();
    await page.waitForURL(/\/teams\/[a-z2-7]{20}$/);
    const teamId = new URL(page.url()).pathname.split("/").pop()!;

    // The CSV import preview parses in a Web Worker.
    await page.goto(`/teams/${teamId}/baselines/import`);
    await page.getByTestId("file-input").setInputFiles("public/templates/wire-classes-template.csv");
    await page.getByTestId("import-preview").waitFor();
    expect(await page.getByTestId("preview-rows").innerText()).toBe("4");
    await page.getByLabel("Name of the new baseline").fill("Policy from CSV");
    await page.getByRole("button", { name: "Create baseline 4 rows" }).click();
    await page.waitForURL(/\/teams\/[^/]+\/baselines\/[0-9a-f-]{36}$/, { timeout: 30_000 });
    await page.waitForSelector("[data-testid=class-table]");

    // The demo-like workspace (baseline and scenarios) for the editor and the report.
    const raw = new Database(inject("dbPath"), { readonly: true });
    const userId = (raw.prepare("select id from users where email = ?").get(email) as { id: string }).id;
    raw.close();
    const knex = openDatabase(inject("dbPath"));
    let scenarioIds: string[];
    try {
      ({ scenarioIds } = await seedDemoWorkspace(knex, { teamId, ownerId: userId, editorId: userId }));
    } finally {
      await knex.destroy();
    }

    // The editor: the engine runs in a Web Worker, the results table and the @visx charts render, the field check runs.
    await page.goto(`/teams/${teamId}/scenarios/${scenarioIds[1]}?metric=delay&from=0.5&to=4`);
    await waitForResults(page);
    expect(await page.locator(".sweep-chart path").count()).toBeGreaterThan(0);
    await page.click("text=Run field check");
    await page.waitForSelector("[data-testid=field-check-result]", { timeout: 60_000 });

    // A report: compose, render (static SVG sweeps and the reused ratio charts), download the PDF (the server's
    // headless Chromium renders the print view under the same policy), and open the share page signed out.
    await page.goto(`/teams/${teamId}/reports`);
    await page.getByLabel("Title").fill("Policy review");
    await page.getByRole("button", { name: "Freeze report" }).click();
    await page.waitForURL(/\/reports\/[a-z0-9]+$/);
    await expect.poll(() => page.getByRole("heading", { name: "Policy review", level: 1 }).isVisible()).toBe(true);
    await expect.poll(() => page.locator(".report-ratio svg rect").count()).toBeGreaterThan(3);
    const [download] = await Promise.all([page.waitForEvent("download", { timeout: 90_000 }), page.getByRole("link", { name: "Download PDF" }).click()]);
    const pdfFile = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "plateau-csp-")), "report.pdf");
    await download.saveAs(pdfFile);
    expect(fs.readFileSync(pdfFile).subarray(0, 5).toString("latin1")).toBe("%PDF-");

    await page.getByRole("button", { name: "Create share link" }).click();
    const urlBox = page.getByTestId("new-share-url");
    await expect.poll(() => urlBox.inputValue()).toMatch(/\/r\/[A-Za-z0-9_-]{43}$/);
    const shareUrl = await urlBox.inputValue();
    const anonCtx = await browser.newContext({ viewport: { width: 1200, height: 900 } });
    await watched(anonCtx, watch);
    const anon = await anonCtx.newPage();
    const shared = await anon.goto(shareUrl);
    expect(shared?.status()).toBe(200);
    expect(shared?.headers()["referrer-policy"]).toBe("no-referrer");
    await expect.poll(() => anon.locator(".report-ratio svg rect").count()).toBeGreaterThan(3);
    await anonCtx.close();
    // An unknown link's page: a route handler's own HTML, styled by a <style> carrying the request's nonce.
    const goneCtx = await browser.newContext();
    await watched(goneCtx, watch, true);
    const gone = await goneCtx.newPage();
    const missing = await gone.goto(`${baseUrl}/r/${"x".repeat(43)}`);
    expect(missing?.status()).toBe(404);
    expect(await gone.evaluate(() => getComputedStyle(document.querySelector("main")!).borderTopStyle)).toBe("solid");
    await goneCtx.close();
    await ctx.close();

    expect(watch.problems).toEqual([]);
  });
});
