import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, signedInContext } from "../helpers/browser";
import { openDatabase } from "@/db/connect";
import { seedDemoWorkspace } from "@/lib/demo/seed-workspace";
import { seedDemoReports } from "@/lib/demo/seed-reports";
import { evaluateRoadmap, type RoadmapStep, type Technology, type WireClass } from "@/lib/scaling";
import { type Client, userWithTeam } from "../helpers/http";

// Issue 14 in the browser: the stack view on the demo baseline (notes, reorder by keyboard writes the stored order)
// and a three-step roadmap built from the demo baseline whose table shows the engine's own evaluateRoadmap figures.

const SHOTS = process.env.PLATEAU_SHOTS_DIR ?? "/tmp/shots-rm-ui";
let browser: Browser;
let baseUrl: string;
let owner: { client: Client; teamId: string; userId: string };
let baselineId: string;
let reportId: string;

beforeAll(async () => {
  baseUrl = inject("baseUrl");
  fs.mkdirSync(SHOTS, { recursive: true });
  owner = await userWithTeam("Roadmaps (e2e)");
  const knex = openDatabase(inject("dbPath"));
  try {
    const w = await seedDemoWorkspace(knex, { teamId: owner.teamId, ownerId: owner.userId, editorId: owner.userId });
    baselineId = w.baselineId;
    ({ reportId } = await seedDemoReports(knex, {
      teamId: owner.teamId,
      ownerId: owner.userId,
      baselineId,
      scenarioIds: w.scenarioIds,
      roadmapIds: w.roadmapIds,
    }));
  } finally {
    await knex.destroy();
  }
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

/** A page of the owner at `width` px that records console errors and uncaught page errors. */
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

const storedOrder = async () => ((await owner.client.get(`/api/baselines/${baselineId}`)).json.baseline.classes as { name: string }[]).map((c) => c.name);

describe("stack view on the baseline page", () => {
  it("draws every class as a layer, names the ILD mismatches, and Alt+↑ on a layer writes the new order", async () => {
    const { page, problems } = await pageAt(1440);
    await page.goto(`${baseUrl}/teams/${owner.teamId}/baselines/${baselineId}`);
    const layers = page.getByTestId("stack-layer");
    await layers.first().waitFor();
    // top layer first: the stored order reversed
    const before = await storedOrder();
    expect(before).toEqual(["local", "intermediate", "semi-global", "global"]);
    expect(await layers.evaluateAll((els) => els.map((e) => e.getAttribute("data-class")))).toEqual([...before].reverse());
    expect(await page.getByTestId("stack-view").getByTestId("cross-section").count()).toBe(4);
    // the demo's local layer has 30 nm above, the intermediate layer 50 nm below (scaling/examples/skua-baseline.csv)
    const notes = await page.getByTestId("stack-note").allInnerTexts();
    expect(notes).toContain("local's ILD above (30 nm) differs from intermediate's ILD below (50 nm).");
    for (const w of [1440, 1024, 390]) {
      await page.setViewportSize({ width: w, height: 900 });
      await page.getByTestId("stack-view").scrollIntoViewIfNeeded();
      await page.screenshot({ path: `${SHOTS}/stack-${w}.png`, fullPage: true });
    }
    await page.setViewportSize({ width: 1440, height: 900 });

    const local = page.getByRole("listitem", { name: "Layer 1 from the bottom: local" });
    await local.focus();
    await page.keyboard.press("Alt+ArrowUp");
    await page.getByTestId("stack-status").filter({ hasText: "Moved local to layer 2 from the bottom" }).waitFor();
    expect(await storedOrder()).toEqual(["intermediate", "local", "semi-global", "global"]);
    // the moved layer keeps the focus, so a second press moves it on
    await page.keyboard.press("Alt+ArrowDown");
    await page.getByTestId("stack-status").filter({ hasText: "Moved local to layer 1 from the bottom" }).waitFor();
    expect(await storedOrder()).toEqual(before);
    // the buttons do the same
    await page.getByTestId("stack-layers").getByRole("button", { name: "Move layer global down" }).click();
    await page.getByTestId("stack-status").filter({ hasText: "Moved global to layer 3 from the bottom" }).waitFor();
    expect(await storedOrder()).toEqual(["local", "intermediate", "global", "semi-global"]);
    await page.getByTestId("stack-layers").getByRole("button", { name: "Move layer global up" }).click();
    await page.getByTestId("stack-status").filter({ hasText: "Moved global to layer 4 from the bottom" }).waitFor();
    expect(await storedOrder()).toEqual(before);
    expect(problems).toEqual([]);
  });
});

describe("a three-step roadmap from the demo baseline", () => {
  it("is built in the browser, saved, and its table shows the engine's evaluateRoadmap figures", async () => {
    const { page, problems } = await pageAt(1440);
    await page.goto(`${baseUrl}/teams/${owner.teamId}/roadmaps`);
    await page.getByLabel("Roadmap name").fill("Three nodes (e2e)");
    await page.getByRole("button", { name: "New roadmap" }).click();
    await page.waitForURL(/\/roadmaps\/[^/]+$/);
    const roadmapId = page.url().split("/").pop()!;

    // N1: S = 1.25 for every class
    await page.getByLabel("S for this step").fill("1.25");
    // N2: S = 1.2, lengths follow S
    await page.getByTestId("add-step").click();
    await page.getByLabel("Name of step 2").waitFor();
    await page.getByLabel("S for this step").fill("1.2");
    await page.getByLabel("Length rule", { exact: true }).selectOption("follows-s");
    expect(await page.getByTestId("step-editor").getByTestId("length-rule-words").first().innerText()).toBe("lengths follow the cross-section: S_L = S = 1.2");
    // N3: the intermediate class to a 45 nm pitch (its S derived from its N2 pitch), the others S = 1.1
    await page.getByTestId("add-step").click();
    await page.getByLabel("Name of step 3").waitFor();
    await page.getByLabel("S for this step").fill("1.1");
    await page.getByText("Per class: target pitch, S, length rule and options").click();
    await page.getByLabel("Target pitch for intermediate (nm)").fill("45");
    await page.getByTestId("save-roadmap").click();
    await page.getByText("Saved as version 2.").waitFor();

    const saved = (await owner.client.get(`/api/roadmaps/${roadmapId}`)).json.roadmap as { steps: RoadmapStep[] };
    expect(saved.steps.map((s) => s.name)).toEqual(["N1", "N2", "N3"]);
    expect(saved.steps[2]!.settings.overrides?.intermediate?.targetPitchM).toBeCloseTo(45e-9, 15);

    // The engine's own figures (lib/scaling evaluateRoadmap), at level full as the table shows by default
    const b = (await owner.client.get(`/api/baselines/${baselineId}`)).json.baseline as {
      technology: Technology;
      classes: (WireClass & { id?: string; position?: number; histogramBins?: number })[];
    };
    const classes = b.classes.map(({ id: _i, position: _p, histogramBins: _h, ...c }) => c as WireClass);
    const steps = saved.steps.map((s, i) => (i === 0 ? { ...s, settings: { ...s.settings, level: "full" as const } } : s));
    const engine = evaluateRoadmap({ classes, technology: b.technology, steps });
    const n3Delay = engine.steps[2]!.evaluation.classes.find((c) => c.name === "intermediate")!.scenario.delayS * 1e12;

    await page.waitForFunction(() => document.querySelector("[data-testid=roadmap-fresh]")?.getAttribute("data-fresh") === "1");
    const panel = page.locator('[data-testid=roadmap-class][data-class="intermediate"]');
    const cell = panel.locator('tr[data-step="N3"] [data-testid=roadmap-value]');
    expect(Number(await cell.getAttribute("data-value"))).toBeCloseTo(n3Delay, 9);
    expect(await cell.innerText()).toBe(String(Number(n3Delay.toPrecision(3))));
    // the pitch column: 80 nm at N0 (the demo CSV) → 45 nm at N3
    expect(await panel.locator('tr[data-step="N3"] td').nth(2).innerText()).toBe("45");
    // a reading per class and a drawn chart (four level lines)
    expect(await page.getByTestId("roadmap-reading").count()).toBe(4);
    expect(await panel.getByTestId("roadmap-reading").innerText()).toMatch(/^intermediate delay /);
    expect(await panel.locator(".roadmap-chart path").count()).toBeGreaterThan(3);

    // branch comparison: a demo roadmap on the same baseline joins the chart and the table
    await page.getByLabel("Copper, fixed barrier").check();
    await page.waitForFunction(() => document.querySelector("[data-testid=roadmap-fresh]")?.getAttribute("data-fresh") === "1");
    await panel.getByRole("columnheader", { name: "Copper, fixed barrier" }).waitFor();
    expect(await panel.getByRole("list", { name: "Legend" }).innerText()).toContain("Copper, fixed barrier");

    for (const w of [1440, 1024, 390]) {
      await page.setViewportSize({ width: w, height: 900 });
      await page.waitForTimeout(300);
      await page.screenshot({ path: `${SHOTS}/roadmap-${w}.png`, fullPage: true });
      // nothing sticks out sideways at phone width (wide tables scroll inside their own box)
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(w);
    }

    // a step made from a scenario after N3: the editor says that its settings now apply relative to N3
    await page.setViewportSize({ width: 1440, height: 900 });
    const pick = page.getByLabel("New step from a scenario");
    await pick.selectOption({ index: 1 });
    await page.getByRole("button", { name: "Add", exact: true }).click();
    await page.getByText(/a roadmap step's are relative to the step before it \(N3\)/).waitFor();
    expect(await page.getByTestId("from-scenario-note").innerText()).toBe("started from a scenario: its settings apply relative to N3, not to the baseline");

    // the history lists both saved versions; loading version 1 (one step, N1) replaces the unsaved draft after a confirm
    const history = page.getByTestId("history");
    await history.getByText("v2").waitFor();
    page.once("dialog", (d) => void d.accept());
    await history.getByRole("button", { name: "Load into editor" }).click();
    await page.getByText("Loaded version 1 into the editor. Save to make it the current version (3).").waitFor();
    expect(await page.getByText("1 of 8 steps").count()).toBe(1);
    expect(problems).toEqual([]);
  });
});

describe("scenarios: duplicate and the length rule", () => {
  it("duplicates a scenario from the list, names a new one from the editor, and says what a global length rule does", async () => {
    const { page, problems } = await pageAt(1440);
    const list = async () =>
      ((await owner.client.get(`/api/teams/${owner.teamId}/scenarios`)).json.scenarios as { id: string; name: string }[]).map((s) => s.name);
    const before = await list();
    const source = before[0]!;
    await page.goto(`${baseUrl}/teams/${owner.teamId}/scenarios`);
    await page.getByRole("button", { name: `Duplicate ${source}`, exact: true }).click();
    await page.waitForURL(/\/scenarios\/[^/?]+(\?.*)?$/);
    await page.getByTestId("results-table").waitFor({ state: "attached" });
    const after = await list();
    expect(after.length).toBe(before.length + 1);
    const copy = after.find((n) => !before.includes(n))!;
    expect(copy.startsWith(source)).toBe(true);

    // "New scenario from this one" under a typed name
    await page.getByRole("button", { name: "New scenario from this one" }).click();
    await page.getByLabel("Name of the new scenario").fill("Variant from the editor (e2e)");
    await page.getByRole("button", { name: "Create", exact: true }).click();
    await page.waitForFunction(
      () =>
        document.querySelector("[name=scenario-name]")?.textContent === "Variant from the editor (e2e)" ||
        (document.querySelector("[name=scenario-name]") as HTMLTextAreaElement | null)?.value === "Variant from the editor (e2e)",
    );
    expect(await list()).toContain("Variant from the editor (e2e)");

    // the global length rule beside S_L, in words (S = the scenario's S)
    await page.getByRole("textbox", { name: "S — cross-section factor value" }).fill("1.5");
    await page.getByLabel("Length rule (all classes)").selectOption("power");
    expect(await page.locator("#settings").getByTestId("length-rule-words").innerText()).toBe("lengths shrink as S^0.5: S_L = 1.22 at S = 1.5");
    expect(problems).toEqual([]);
  });
});

describe("a report with frozen roadmaps", () => {
  it("draws each frozen roadmap per class with its reading and table", async () => {
    const { page, problems } = await pageAt(1440);
    await page.goto(`${baseUrl}/teams/${owner.teamId}/reports/${reportId}`);
    const section = page.getByTestId("report-roadmaps");
    await section.waitFor();
    const frozen = (await owner.client.get(`/api/reports/${reportId}`)).json.report.frozen as { roadmaps?: { name: string }[] };
    expect(frozen.roadmaps?.length).toBeGreaterThan(0);
    for (const r of frozen.roadmaps!) expect(await section.innerText()).toContain(r.name);
    expect(await section.locator("svg.report-chart").count()).toBeGreaterThan(0);
    await section.scrollIntoViewIfNeeded();
    await section.screenshot({ path: `${SHOTS}/report-roadmaps-1440.png` });
    expect(problems).toEqual([]);
  });
});
