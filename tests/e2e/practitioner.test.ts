import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, signedInContext } from "../helpers/browser";
import { openDatabase } from "@/db/connect";
import { seedDemoWorkspace } from "@/lib/demo/seed-workspace";
import { seedDemoReports } from "@/lib/demo/seed-reports";
import { type Client, userWithTeam } from "../helpers/http";

// Issue 13 items 3, 10, 11, 12: the practitioner's path in the browser (S < 1 hint, keyboard, fit at 1024 px, fields whole).

const SHOTS = process.env.PLATEAU_SHOTS_DIR ?? "/tmp/plateau-practitioner-shots";
// the phone and laptop views of the results (issue 13, item 10), looked at by people
const LIVE_SHOTS = process.env.PLATEAU_LIVE_SHOTS_DIR ?? "/tmp/live-shots";
let browser: Browser;
let baseUrl: string;
let owner: { client: Client; teamId: string; userId: string };
let scenarioIds: string[];
let reportId: string;

beforeAll(async () => {
  baseUrl = inject("baseUrl");
  fs.mkdirSync(SHOTS, { recursive: true });
  owner = await userWithTeam("Practitioner (e2e)");
  const knex = openDatabase(inject("dbPath"));
  try {
    const w = await seedDemoWorkspace(knex, { teamId: owner.teamId, ownerId: owner.userId, editorId: owner.userId });
    scenarioIds = w.scenarioIds;
    ({ reportId } = await seedDemoReports(knex, { teamId: owner.teamId, ownerId: owner.userId, baselineId: w.baselineId, scenarioIds: w.scenarioIds }));
  } finally {
    await knex.destroy();
  }
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function editor(width: number, scenario = 0): Promise<Page> {
  const ctx = await signedInContext(browser, owner.client, baseUrl, { width, height: 900 });
  const page = await ctx.newPage();
  await page.goto(`${baseUrl}/teams/${owner.teamId}/scenarios/${scenarioIds[scenario]}`);
  // attached, not visible: on a phone the table is hidden behind the per-class cards
  await page.getByTestId("results-table").waitFor({ state: "attached" });
  return page;
}

const sBox = (page: Page) => page.getByRole("textbox", { name: "S — cross-section factor value" });

describe("S and its slider", () => {
  it("says what S means, and for S < 1 offers the reciprocal with the actual numbers (item 3)", async () => {
    const page = await editor(1440);
    expect(await page.getByText("S = old ÷ new size").count()).toBe(1);
    expect(await page.getByTestId("s-growth-hint").count()).toBe(0);
    await sBox(page).fill("0.7");
    const hint = page.getByTestId("s-growth-hint");
    await hint.waitFor();
    expect(await hint.innerText()).toContain("S = 0.7 < 1 — wires grow: did you mean S = 1/0.7 = 1.43?");
    await page.screenshot({ path: `${SHOTS}/s-below-one.png` });
    await page.getByRole("button", { name: "Use S = 1/0.7 = 1.43" }).click();
    await hint.waitFor({ state: "detached" });
    expect(await sBox(page).inputValue()).toBe("1.428571429");
    // and the box shows it whole (item 12)
    expect(await sBox(page).evaluate((i) => i.scrollWidth <= i.clientWidth)).toBe(true);
    await page.context().close();
  });

  it("arrow keys step the slider from the current value; Home goes to the labelled slider minimum (item 11)", async () => {
    const page = await editor(1440);
    await sBox(page).fill("1.55556");
    await sBox(page).blur();
    const slider = page.getByTestId("s-slider");
    await slider.focus();
    await page.keyboard.press("ArrowRight");
    expect(await sBox(page).inputValue()).toBe("1.56556");
    await page.keyboard.press("ArrowLeft");
    await page.keyboard.press("ArrowLeft");
    expect(await sBox(page).inputValue()).toBe("1.54556");
    expect(await slider.getAttribute("aria-valuetext")).toBe("1.54556");
    // the slider's ends are printed under it and named to screen readers
    const range = await slider.evaluate((el) => document.getElementById(el.getAttribute("aria-describedby")!.split(" ")[0]!)!.getAttribute("aria-label"));
    expect(range).toBe("Slider range 0.5 to 4; type any other value in the box");
    await page.keyboard.press("Home");
    expect(await sBox(page).inputValue()).toBe("0.5");
    await page.context().close();
  });
});

describe("keyboard", () => {
  it("Escape on the account menu gives focus back to its button (item 11)", async () => {
    const page = await editor(1440);
    const button = page.getByRole("button", { name: "Account" });
    await button.focus();
    await page.keyboard.press("Enter");
    await page.getByRole("button", { name: /Sign out/ }).waitFor();
    await page.keyboard.press("Tab");
    await page.keyboard.press("Escape");
    await page.getByRole("button", { name: /Sign out/ }).waitFor({ state: "detached" });
    expect(await page.evaluate(() => document.activeElement?.getAttribute("aria-label"))).toBe("Account");
  });

  it("reaches the sweep without tabbing through the per-class overrides: a link to it, and the overrides collapsed while none is set (item 11)", async () => {
    const page = await editor(1440, 0);
    const overrides = page.getByTestId("overrides");
    const hasOverrides = await page.getByText(/class(es)? with overrides/).count();
    expect(await overrides.evaluate((d) => (d as HTMLDetailsElement).open)).toBe(hasOverrides > 0);
    if (!hasOverrides) expect(await overrides.locator("input:visible").count()).toBe(0);
    await page.getByTestId("skip-to-sweep").click();
    expect(new URL(page.url()).hash).toBe("#sweep");
    const top = await page.getByRole("heading", { name: "Sweep — metric against S" }).evaluate((h) => h.getBoundingClientRect().top);
    expect(top).toBeLessThan(200);
    await page.context().close();
  });
});

describe("fit", () => {
  it("at 1024 px the results table's key columns and the report's table need no sideways scrolling (item 10)", async () => {
    const page = await editor(1024, 1);
    await page.screenshot({ path: `${SHOTS}/editor-1024.png`, fullPage: true });
    fs.mkdirSync(LIVE_SHOTS, { recursive: true });
    await page.screenshot({ path: `${LIVE_SHOTS}/editor-1024-full.png`, fullPage: true });
    await page.screenshot({ path: `${LIVE_SHOTS}/editor-1024.png` });
    // no phone cards at 1024 px: the table
    expect(await page.getByTestId("result-cards").isVisible()).toBe(false);
    const table = page.getByTestId("results-table");
    const fits = await table.evaluate((t) => ({ table: t.scrollWidth, box: t.parentElement!.clientWidth }));
    expect(fits.table).toBeLessThanOrEqual(fits.box);
    for (const col of ["d", "n", "rd", "e"]) expect(await page.locator(`td[data-col=${col}]`).first().isVisible()).toBe(true);
    // every column on request (then the table may scroll, with the class column fixed)
    await page.getByTestId("all-columns").click();
    expect(await page.locator("td[data-col=ca]").first().isVisible()).toBe(true);
    await page.goto(`${baseUrl}/teams/${owner.teamId}/reports/${reportId}`);
    const rt = page.locator("#table table");
    await rt.waitFor();
    const r = await rt.evaluate((t) => ({ table: t.scrollWidth, box: t.parentElement!.clientWidth }));
    expect(r.table).toBeLessThanOrEqual(r.box);
    await page.context().close();
  });

  it("at 390 px the results come before the settings, the key columns need no sideways scrolling and the demo's long name shows whole (item 10)", async () => {
    // the demo's air-gap scenario: the longest demo name ("0.7× shrink + air gaps on intermediate")
    const page = await editor(390, 1);
    const cards = page.getByTestId("result-cards");
    const results = await cards.evaluate((t) => t.getBoundingClientRect().top);
    const settings = await page.getByRole("heading", { name: "Scale factors and options" }).evaluate((h) => h.getBoundingClientRect().top);
    expect(results).toBeLessThan(settings);
    // nothing on the page scrolls sideways
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    // one card per class, each with class, R, C, delay and repeaters visible inside the window
    expect(await cards.locator("[data-testid=result-card]").count()).toBe(4);
    for (const name of ["local", "intermediate", "semi-global", "global"]) {
      const card = cards.locator(`[data-testid=result-card][data-class="${name}"]`);
      expect(await card.locator("h3").innerText()).toContain(name);
      for (const col of ["r", "c", "d", "n"]) {
        const cell = card.locator(`td[data-card-col=${col}]`);
        expect(await cell.isVisible()).toBe(true);
        const box = (await cell.boundingBox())!;
        expect(box.x).toBeGreaterThanOrEqual(0);
        expect(box.x + box.width).toBeLessThanOrEqual(390);
        expect((await cell.innerText()).trim()).toMatch(/^-?[\d.]+(e-?\d+)?$/);
      }
    }
    // the card shows the table's figures (the wide table is hidden on a phone, there on request)
    const d = await cards.locator('[data-class="intermediate"] td[data-card-col=d]').innerText();
    expect(await page.getByTestId("results-table").isVisible()).toBe(false);
    await page.getByTestId("all-columns").click();
    expect(await page.getByTestId("results-table").isVisible()).toBe(true);
    // the table's cell adds the accuracy mark (±)
    expect(await page.locator('tbody[data-class="intermediate"] td[data-col=d]').innerText()).toBe(`${d}±`);
    expect(await cards.isVisible()).toBe(false);
    await page.getByTestId("all-columns").click();
    // the scenario's name wraps inside its box instead of being cut off
    const title = page.locator("[name=scenario-name]");
    expect(await title.inputValue()).toBe("0.7× shrink + air gaps on intermediate");
    const fit = await title.evaluate((t) => ({
      w: t.scrollWidth <= t.clientWidth,
      h: t.scrollHeight <= t.clientHeight + 1,
      right: t.getBoundingClientRect().right,
    }));
    expect(fit).toEqual({ w: true, h: true, right: expect.any(Number) });
    expect(fit.right).toBeLessThanOrEqual(390);
    fs.mkdirSync(LIVE_SHOTS, { recursive: true });
    await page.screenshot({ path: `${SHOTS}/editor-390.png` });
    await page.screenshot({ path: `${LIVE_SHOTS}/editor-390-full.png`, fullPage: true });
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.screenshot({ path: `${LIVE_SHOTS}/editor-390.png` });
    await cards.locator('[data-class="semi-global"]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${LIVE_SHOTS}/editor-390-cards.png` });
    await page.context().close();
  });

  it("shows derived values and long names whole: per-class S_L, the derive-S class list, the scenario title (item 12)", async () => {
    const page = await editor(1440);
    const overrides = page.getByTestId("overrides");
    if (!(await overrides.evaluate((d) => (d as HTMLDetailsElement).open))) await overrides.locator("summary").click();
    const sl = page.getByRole("textbox", { name: /^S_L for / }).first();
    await sl.fill("1.428571429");
    expect(await sl.evaluate((i) => i.scrollWidth <= i.clientWidth)).toBe(true);
    await page.getByText("Derive S from a target pitch").click();
    const select = page.locator("select[name=pitch-class]");
    expect(await select.evaluate((s) => s.scrollWidth <= s.clientWidth + 1)).toBe(true);
    const long = "A long scenario name that a practitioner gives: 0.7x shrink, Ru on M0-M2, air gaps";
    const title = page.locator("[name=scenario-name]");
    await title.fill(long);
    expect(await title.evaluate((i) => i.scrollWidth <= i.clientWidth)).toBe(true);
    await page.context().close();
  });
});
