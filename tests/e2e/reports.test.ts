import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type { Browser } from "playwright-core";
import { launchBrowser } from "../helpers/browser";
import { openDatabase } from "@/db/connect";
import { seedDemoWorkspace } from "@/lib/demo/seed-workspace";
import { userWithTeam } from "../helpers/http";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("reports in the browser", () => {
  it("composes a report from the demo scenarios and opens its share link signed out", async () => {
    const baseUrl = inject("baseUrl");
    const owner = await userWithTeam("Harrow Bay Reports");
    const knex = openDatabase(inject("dbPath"));
    let scenarioNames: string[];
    try {
      const ws = await seedDemoWorkspace(knex, { teamId: owner.teamId, ownerId: owner.userId, editorId: owner.userId });
      expect(ws.scenarioIds).toHaveLength(3);
      scenarioNames = (await knex("scenarios").whereIn("id", ws.scenarioIds).select("name")).map((r) => r.name as string);
    } finally {
      await knex.destroy();
    }

    const ctx = await browser.newContext({ baseURL: baseUrl, viewport: { width: 1400, height: 1000 } });
    const [name, value] = owner.client.cookie.split("=");
    await ctx.addCookies([{ name: name!, value: value!, url: baseUrl }]);
    const page = await ctx.newPage();
    await page.goto(`/teams/${owner.teamId}/reports`);
    await expect.poll(() => page.getByRole("heading", { name: "Reports", level: 1 }).isVisible()).toBe(true);
    // The demo baseline is picked and its three scenarios are ticked; a title is required.
    for (const n of scenarioNames) expect(await page.getByRole("checkbox", { name: n }).isChecked()).toBe(true);
    await page.getByLabel("Title").fill("Skua: options for the program review");
    await page.getByLabel(/Audience note/).fill("For the directors.");
    await page.getByRole("button", { name: "Freeze report" }).click();
    await page.waitForURL(/\/reports\/[a-z0-9]+$/);
    await expect.poll(() => page.getByRole("heading", { name: "Skua: options for the program review", level: 1 }).isVisible()).toBe(true);
    expect(await page.getByRole("heading", { name: "In short" }).isVisible()).toBe(true);
    expect(await page.locator("#in-short li").count()).toBeGreaterThanOrEqual(4);

    await page.getByRole("button", { name: "Create share link" }).click();
    const urlBox = page.getByTestId("new-share-url");
    await expect.poll(() => urlBox.inputValue()).toMatch(/\/r\/[A-Za-z0-9_-]{43}$/);
    const shareUrl = await urlBox.inputValue();
    await expect.poll(() => page.getByText("active", { exact: true }).count()).toBe(1);

    // A fresh browser context: no session, only the link.
    const anonCtx = await browser.newContext({ viewport: { width: 1200, height: 900 } });
    const anon = await anonCtx.newPage();
    const res = await anon.goto(shareUrl);
    expect(res?.status()).toBe(200);
    expect(anon.url()).toBe(`${shareUrl}/report`);
    expect(await anon.getByRole("heading", { name: "Skua: options for the program review", level: 1 }).isVisible()).toBe(true);
    expect(await anon.getByRole("heading", { name: "Side by side, per class" }).isVisible()).toBe(true);
    for (const n of scenarioNames) expect(await anon.locator("#headlines h3", { hasText: n }).count(), n).toBe(1);
    expect(await anon.getByLabel("Caution").isVisible()).toBe(true);
    // The report only: no app navigation, no team name, no sign-in state.
    expect(await anon.getByRole("link", { name: "Baselines" }).count()).toBe(0);
    expect(await anon.getByText("Harrow Bay Reports").count()).toBe(0);
    // The reused ratio charts hydrate and draw their bars.
    await expect.poll(() => anon.locator(".report-ratio svg rect").count()).toBeGreaterThan(3);
    expect(await anon.locator("svg.report-chart path").count()).toBeGreaterThan(3);
    await anonCtx.close();

    // Send by e-mail (a second link), then revoke the first link: the list follows both without a reload,
    // and the revoked link no longer opens the report.
    await page.getByLabel(/^To \(up to 20 addresses/).fill("director@example.test");
    await page.getByRole("button", { name: "Send summary and link" }).click();
    await page.getByText("Sent to 1 address, with a new share link.").waitFor();
    await expect.poll(() => page.getByText("active", { exact: true }).count()).toBe(2);
    await page
      .getByRole("button", { name: /^Revoke the link made/ })
      .last()
      .click(); // newest first: the last is the first link
    await expect.poll(() => page.getByText("revoked", { exact: true }).count()).toBe(1);
    expect(await page.getByText("active", { exact: true }).count()).toBe(1);
    expect((await fetch(shareUrl, { redirect: "manual" })).status).toBe(404);
    await ctx.close();
  });
});
