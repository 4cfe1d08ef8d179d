import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, signedInContext } from "../helpers/browser";
import { openDatabase } from "@/db/connect";
import { seedDemoWorkspace } from "@/lib/demo/seed-workspace";
import { type Client, userWithTeam } from "../helpers/http";

// Issue 15 items 2 and 3 in the browser: the demo scenario's "Layer shaping" page — pick a class, the heat map with
// its optimum, Cancel ends the worker's computation and the next request works, "Apply to scenario" saves the
// override and the editor shows it.

const SHOTS = process.env.PLATEAU_SHOTS_DIR ?? "/tmp/shots/shape";
let browser: Browser;
let baseUrl: string;
let owner: { client: Client; teamId: string; userId: string };
let scenarioIds: string[];

beforeAll(async () => {
  baseUrl = inject("baseUrl");
  fs.mkdirSync(SHOTS, { recursive: true });
  owner = await userWithTeam("Shaping (e2e)");
  const knex = openDatabase(inject("dbPath"));
  try {
    ({ scenarioIds } = await seedDemoWorkspace(knex, { teamId: owner.teamId, ownerId: owner.userId, editorId: owner.userId }));
  } finally {
    await knex.destroy();
  }
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function pageAt(width: number): Promise<{ page: Page; problems: string[] }> {
  const ctx = await signedInContext(browser, owner.client, baseUrl, { width, height: 900 });
  const page = await ctx.newPage();
  const problems: string[] = [];
  page.on("pageerror", (e) => problems.push(`page error: ${String(e)}`));
  page.on("console", (m) => {
    if (m.type() === "error") problems.push(`console error on ${page.url()}: ${m.text()}`);
  });
  return { page, problems };
}

describe("Layer shaping", () => {
  it("opens from the editor, shows the heat map with its optimum, cancels cleanly, and applies the optimum to the scenario", async () => {
    const { page, problems } = await pageAt(1440);
    const id = scenarioIds[0]!;
    // The worker's script is held back for a few seconds at first, so the first computation is surely still running
    // when Cancel is pressed (a warm computation takes a fraction of a second: too quick to race against a click).
    let holdWorker = true;
    let held = 0;
    await page.context().route(/turbopack-worker|design-worker/, async (route) => {
      if (holdWorker) {
        held++;
        await new Promise((r) => setTimeout(r, 4000));
      }
      await route.continue();
    });
    await page.goto(`${baseUrl}/teams/${owner.teamId}/scenarios/${id}`);
    await page.getByTestId("shaping-link").click();
    await page.waitForURL(/\/shaping$/);
    await page.getByRole("heading", { name: "Layer shaping" }).waitFor();

    // cancel: the first class's computation is running; Cancel ends the worker, nothing of it lands later
    await page.getByTestId("shaping-progress").waitFor();
    await page.getByTestId("shaping-cancel").click();
    await page.getByTestId("shaping-cancelled").waitFor();
    holdWorker = false;
    expect(held).toBeGreaterThan(0);
    await page.waitForTimeout(5000); // longer than the hold: a cancelled computation must not come back
    expect(await page.getByTestId("shaping-cancelled").count()).toBe(1);
    expect(await page.getByTestId("heat-map").count()).toBe(0);

    // the next request works: pick a class, the heat map and its optimum mark appear (computed in a fresh worker)
    await page.getByLabel("Class").selectOption("intermediate");
    await page.getByTestId("optimum-mark").waitFor({ timeout: 60_000 });
    await expect.poll(() => page.getByTestId("shaping-summary").innerText()).toContain("At pitch");
    expect(await page.getByTestId("heat-map").locator("rect").count()).toBeGreaterThanOrEqual(1600);
    expect(await page.getByTestId("tornado-row").count()).toBeGreaterThan(5);
    await page.getByTestId("pareto-chart").waitFor();
    // hover readout: the point under the pointer with its value and unit
    await page
      .getByTestId("heat-map")
      .locator("svg")
      .first()
      .hover({ position: { x: 250, y: 150 } });
    await expect.poll(() => page.getByTestId("heat-readout").innerText()).toMatch(/^Line fraction 0\.\d+, aspect ratio \d\.\d\d: [\d.]+ ps$/);

    // another objective: the newest request's answer is shown
    await page.getByLabel("Objective").selectOption("energy");
    await expect.poll(() => page.getByTestId("shaping-summary").innerText(), { timeout: 60_000 }).toContain("Energy (fJ) — objective");

    // bad limits: a message naming the field, no computation
    await page.getByLabel("Line fraction from").fill("0.9");
    await expect.poll(() => page.locator("#f-shaping-maxFraction-error").innerText()).toContain("Largest line fraction must be above the smallest.");
    await page.getByLabel("Line fraction from").fill("0.3");
    // limits that leave no geometry: the engine's refusal in words
    await page.getByLabel("Minimum width (nm)").fill("40");
    await page.getByLabel("Minimum space (nm)").fill("40");
    await expect.poll(() => page.getByTestId("shaping-error").innerText(), { timeout: 30_000 }).toMatch(/^No feasible geometry/);
    await page.getByLabel("Minimum width (nm)").fill("0");
    await page.getByLabel("Minimum space (nm)").fill("0");
    await page.getByLabel("Objective").selectOption("delay");
    await page.getByTestId("optimum-mark").waitFor({ timeout: 30_000 });
    await expect.poll(() => page.getByTestId("shaping-summary").innerText()).toContain("50% delay (ps) — objective");

    for (const w of [1440, 1024, 390]) {
      await page.setViewportSize({ width: w, height: 900 });
      await page.waitForTimeout(300);
      await page.screenshot({ path: `${SHOTS}/shaping-${w}.png`, fullPage: true });
    }
    await page.setViewportSize({ width: 1440, height: 900 });

    // apply: the scenario's override gains lineFraction and aspectRatio; the link goes back to the editor, which shows it
    await page.getByTestId("shaping-apply").click();
    await page.getByTestId("shaping-applied").waitFor();
    const stored = (await owner.client.get(`/api/scenarios/${id}`)).json.scenario;
    expect(stored.version).toBe(2);
    expect(Object.keys(stored.settings.overrides.intermediate).sort()).toEqual(["aspectRatio", "lineFraction"]);
    await page.getByTestId("shaping-applied").getByRole("link", { name: "Back to the scenario" }).click();
    await page.waitForURL(new RegExp(`/scenarios/${id}$`));
    await expect.poll(() => page.getByTestId("overrides").locator("summary").innerText()).toContain("1 class with overrides: intermediate");
    const lf = stored.settings.overrides.intermediate.lineFraction as number;
    await expect.poll(() => page.getByTestId("line-fraction-overrides").innerText()).toContain(`intermediate ${Number(lf.toPrecision(6))}`);
    expect(problems).toEqual([]);
  });

  it("a report with the Layer shaping section shows one table per option (screenshots at 1440 and 390 px)", async () => {
    const baselineId = (await owner.client.get(`/api/scenarios/${scenarioIds[0]}`)).json.scenario.baselineId;
    const r = await owner.client.post(`/api/teams/${owner.teamId}/reports`, {
      baselineId,
      scenarioIds: scenarioIds.slice(0, 2),
      title: "Shaping in a report",
      shaping: { objective: "delay" },
    });
    expect(r.status, r.text).toBe(201);
    const { page, problems } = await pageAt(1440);
    await page.goto(`${baseUrl}/teams/${owner.teamId}/reports/${r.json.report.id}`);
    const section = page.getByTestId("report-shaping");
    await section.waitFor();
    expect(await section.locator("table").count()).toBe(2);
    expect(await section.locator("tbody tr").count()).toBe(8); // 2 options × 4 demo classes
    for (const w of [1440, 390]) {
      await page.setViewportSize({ width: w, height: 900 });
      await section.scrollIntoViewIfNeeded();
      await section.screenshot({ path: `${SHOTS}/report-shaping-${w}.png` });
    }
    expect(problems).toEqual([]);
  });
});
