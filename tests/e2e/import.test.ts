import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type { Browser, BrowserContext } from "playwright-core";
import { launchBrowser, signedInContext } from "../helpers/browser";
import { userWithTeam, type Client } from "../helpers/http";
import { postCsv, TEMPLATE_CLASSES } from "../app/import-helpers";

const SHOTS = process.env.PLATEAU_SHOTS_DIR ?? "/tmp/plateau-import-shots";
let browser: Browser;
let ctx: BrowserContext;
let baseUrl: string;
let owner: { client: Client; teamId: string };
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-e2e-import-"));

beforeAll(async () => {
  baseUrl = inject("baseUrl");
  fs.mkdirSync(SHOTS, { recursive: true });
  owner = await userWithTeam("Harrow Bay Silicon (import e2e)");
  browser = await launchBrowser();
  ctx = await signedInContext(browser, owner.client, baseUrl, { width: 1360, height: 1000 });
});

afterAll(async () => {
  await browser?.close();
  fs.rmSync(tmp, { recursive: true, force: true });
});

describe("CSV import in the browser", () => {
  it("uploads the template, shows the preview and progress, confirms, and the classes appear in the baseline's table; then imports a large histogram with upload progress", async () => {
    const page = await ctx.newPage();
    await page.goto(`${baseUrl}/teams/${owner.teamId}/baselines/import`);
    await page.getByTestId("file-input").setInputFiles("public/templates/wire-classes-template.csv");
    await page.getByTestId("import-preview").waitFor();
    expect(await page.getByTestId("preview-rows").innerText()).toBe("4");
    const totals = await page.getByTestId("preview-totals").innerText();
    for (const c of ["local", "intermediate", "semi-global", "global"]) expect(totals).toContain(c);
    expect(await page.getByText("comma ,").count()).toBe(1);
    await page.screenshot({ path: `${SHOTS}/01-new-baseline-preview.png`, fullPage: true });
    await page.getByLabel("Name of the new baseline").fill("Skua from CSV");
    await page.getByRole("button", { name: "Create baseline 4 rows" }).click();
    await page.waitForURL(/\/teams\/[^/]+\/baselines\/[0-9a-f-]{36}$/, { timeout: 30_000 });
    const baselineUrl = page.url();
    await page.waitForFunction(
      (names) =>
        names.every((n) => document.body.innerText.includes(n) || [...document.querySelectorAll("input")].some((i) => (i as HTMLInputElement).value === n)),
      ["local", "intermediate", "semi-global", "global"],
      { timeout: 30_000 },
    );
    await page.screenshot({ path: `${SHOTS}/02-baseline-after-import.png`, fullPage: true });

    // a 150,000-row histogram file, uploaded through a throttled connection so the upload progress shows
    const big = path.join(tmp, "skua-histograms-large.csv");
    let text = "class,length_um,count\n";
    for (const c of ["local", "intermediate", "semi-global", "global"])
      for (let i = 1; i <= 37_500; i++) text += `${c},${(i * 0.5).toFixed(1)},${(i % 50) + 1}\n`;
    fs.writeFileSync(big, text);
    await page.goto(`${baselineUrl}/import?kind=histograms`);
    await page.getByTestId("file-input").setInputFiles(big);
    await page.getByTestId("import-preview").waitFor({ timeout: 60_000 });
    expect(await page.getByTestId("preview-rows").innerText()).toBe("150,000");
    expect(await page.getByTestId("preview-totals").innerText()).toContain("37,500");
    const importButton = page.getByRole("button", { name: "Import 150,000 rows" });
    expect(await importButton.isDisabled()).toBe(true); // the mode must be chosen explicitly
    await page.getByLabel(/^Merge/).check();
    const cdp = await ctx.newCDPSession(page);
    await cdp.send("Network.enable");
    await cdp.send("Network.emulateNetworkConditions", {
      offline: false,
      latency: 0,
      downloadThroughput: -1,
      uploadThroughput: 600 * 1024,
    });
    await importButton.click();
    const bar = page.getByRole("progressbar", { name: "Uploading" });
    await bar.waitFor({ timeout: 10_000 });
    await page.waitForFunction(() => Number(document.querySelector("[role=progressbar]")?.getAttribute("aria-valuenow") ?? 0) > 0, undefined, {
      timeout: 20_000,
    });
    await page.screenshot({ path: `${SHOTS}/03-histogram-upload-progress.png`, fullPage: true });
    await page.waitForURL(baselineUrl, { timeout: 60_000 });
    await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    const bins = await owner.client.get(`/api/baselines/${baselineUrl.split("/").pop()}/histograms`);
    expect(bins.json.classes.map((c: { bins: unknown[] }) => c.bins.length)).toEqual([37_500, 37_500, 37_500, 37_500]);
    await page.close();
  });

  it("shows every warning a histogram import returns on the baseline, keeps it across reloads and dismisses it (issue 13 item 2)", async () => {
    const made = await postCsv(
      owner.client,
      `/api/teams/${owner.teamId}/baselines/import?name=${encodeURIComponent("Warnings (import e2e)")}`,
      TEMPLATE_CLASSES,
    );
    expect(made.status, made.text).toBe(201);
    const baselineId = made.json.baseline.id as string;
    const file = path.join(tmp, "short-histograms.csv");
    // the template's global class has 4,000 nets; this histogram holds 3,999
    fs.writeFileSync(file, "class,length_um,count\nglobal,1000,3999\n");
    const page = await ctx.newPage();
    const baselineUrl = `${baseUrl}/teams/${owner.teamId}/baselines/${baselineId}`;
    await page.goto(`${baselineUrl}/import?kind=histograms`);
    await page.getByTestId("file-input").setInputFiles(file);
    await page.getByTestId("import-preview").waitFor();
    await page.getByLabel(/^Merge/).check();
    await page.getByRole("button", { name: "Import 1 rows" }).click();
    await page.waitForURL(baselineUrl, { timeout: 30_000 });
    const text = 'Class "global": the histogram holds 3,999 nets, the class table says 4,000; distribution results use the histogram.';
    const box = page.getByTestId("baseline-warnings");
    await box.waitFor();
    expect(await box.innerText()).toContain(text);
    await page.screenshot({ path: `${SHOTS}/05-baseline-warning.png`, fullPage: false });
    await page.reload();
    await box.waitFor();
    expect(await page.getByTestId("baseline-warning").count()).toBe(1);
    await page.getByRole("button", { name: `Dismiss: ${text}` }).click();
    await box.waitFor({ state: "detached" });
    await page.reload();
    await page.getByRole("heading", { name: /Technology/ }).waitFor();
    expect(await page.getByTestId("baseline-warnings").count()).toBe(0);
    expect((await owner.client.get(`/api/baselines/${baselineId}/warnings`)).json.warnings).toEqual([]);
    await page.close();
  });

  it("shows the server's answer when it refuses a valid upload (a taken baseline name), and stores nothing", async () => {
    const name = "Taken name (import e2e)";
    const made = await owner.client.post(`/api/teams/${owner.teamId}/baselines`, { name });
    expect(made.status, made.text).toBe(201);
    const count = async () => ((await owner.client.get(`/api/teams/${owner.teamId}/baselines`)).json.baselines as unknown[]).length;
    const before = await count();
    const page = await ctx.newPage();
    await page.goto(`${baseUrl}/teams/${owner.teamId}/baselines/import`);
    await page.getByTestId("file-input").setInputFiles("public/templates/wire-classes-template.csv");
    await page.getByTestId("import-preview").waitFor();
    await page.getByLabel("Name of the new baseline").fill(name);
    await page.getByRole("button", { name: "Create baseline 4 rows" }).click();
    await page.getByText(`A baseline named "${name}" already exists in this team.`).waitFor({ timeout: 30_000 });
    expect(new URL(page.url()).pathname).toBe(`/teams/${owner.teamId}/baselines/import`);
    // The form stays usable: another name goes through.
    expect(await page.getByRole("button", { name: "Create baseline 4 rows" }).isEnabled()).toBe(true);
    expect(await count()).toBe(before);
    await page.close();
  });

  it("shows a broken file's errors with line, column, value and reason, and offers them as CSV", async () => {
    const page = await ctx.newPage();
    const bad = path.join(tmp, "broken.csv");
    fs.writeFileSync(
      bad,
      "class,tier,width_nm,thickness_nm,spacing_nm,ild_below_nm,ild_above_nm,barrier_nm,metal,k,net_count,mean_length_um,driver_ohm,load_ff,activity\n" +
        "local,local,24,48,24,30,30,2,Cu,2.7,1200000,4,8000,0.4,0.15\n" +
        "global,global,-4,800,400,400,,5,Unobtainium,3.0,4000,1500,300,5.0,0.1\n",
    );
    await page.goto(`${baseUrl}/teams/${owner.teamId}/baselines/import`);
    await page.getByTestId("file-input").setInputFiles(bad);
    const errors = page.getByTestId("import-errors");
    await errors.waitFor();
    const t = await errors.innerText();
    expect(t).toContain("2 errors");
    expect(t).toMatch(/3\s+width_nm\s+"-4"\s+must be > 0/);
    expect(t).toMatch(/3\s+metal\s+"Unobtainium"\s+must be one of Cu, Al, W, Co, Ru/);
    expect(await page.getByRole("button", { name: "Download errors (CSV)" }).count()).toBe(1);
    expect(await page.getByRole("button", { name: /Create baseline/ }).count()).toBe(0);
    await page.screenshot({ path: `${SHOTS}/04-broken-file-errors.png`, fullPage: true });
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: "Download errors (CSV)" }).click()]);
    const file = path.join(tmp, "errors.csv");
    await download.saveAs(file);
    expect(fs.readFileSync(file, "utf8").split("\r\n")[0]).toBe("line,column,value,message");
    await page.close();
  });

  it("says once that a semicolon file uses decimal commas, converts it exactly in the preview, and imports the converted file (issue 13 item 8)", async () => {
    const page = await ctx.newPage();
    const semi = path.join(tmp, "skua-decimal-commas.csv");
    fs.writeFileSync(semi, TEMPLATE_CLASSES.replace(/,/g, ";").replace(/(\d)\.(\d)/g, "$1,$2"));
    await page.goto(`${baseUrl}/teams/${owner.teamId}/baselines/import`);
    await page.getByTestId("file-input").setInputFiles(semi);
    const errors = page.getByTestId("import-errors");
    await errors.waitFor();
    const t = await errors.innerText();
    expect(t).toContain("1 error");
    expect(t.match(/decimal comma/g)).toHaveLength(1);
    expect(t).toContain('such as "2,7" (line 2, k)');
    expect(await page.getByText("semicolon ;").count()).toBe(1);
    expect(await page.getByRole("button", { name: /Create baseline/ }).count()).toBe(0);
    await page.screenshot({ path: `${SHOTS}/05-decimal-commas.png`, fullPage: true });
    await page.getByRole("button", { name: "Convert to decimal points" }).click();
    await page.getByText(/Converted to comma-separated with decimal points/).waitFor();
    expect(await page.getByTestId("import-errors").count()).toBe(0);
    expect(await page.getByText("comma ,").count()).toBe(1);
    expect(await page.getByTestId("preview-rows").innerText()).toBe("4");
    expect(await page.getByText("2. Preview of skua-decimal-commas-decimal-points.csv").count()).toBe(1);
    expect(await page.getByRole("button", { name: "Convert to decimal points" }).count()).toBe(0);
    // the converted file, downloaded: exactly the template (digit for digit: "3.0" stays "3.0", "1.0" stays "1.0")
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: "Download it" }).click()]);
    const converted = path.join(tmp, "converted.csv");
    await download.saveAs(converted);
    expect(fs.readFileSync(converted, "utf8")).toBe(TEMPLATE_CLASSES);
    await page.screenshot({ path: `${SHOTS}/06-decimal-commas-converted.png`, fullPage: true });
    await page.getByLabel("Name of the new baseline").fill("Skua with decimal commas");
    await page.getByRole("button", { name: "Create baseline 4 rows" }).click();
    await page.waitForURL(/\/teams\/[^/]+\/baselines\/[0-9a-f-]{36}$/, { timeout: 30_000 });
    const id = page.url().split("/").pop()!;
    // the stored classes are those of the template uploaded as it is
    const ref = await postCsv(owner.client, `/api/teams/${owner.teamId}/baselines/import?name=${encodeURIComponent("Skua reference")}`, TEMPLATE_CLASSES);
    expect(ref.status).toBe(201);
    const mine = await owner.client.get(`/api/baselines/${id}/export.csv`);
    const theirs = await owner.client.get(`/api/baselines/${ref.json.baseline.id}/export.csv`);
    expect(mine.status).toBe(200);
    expect(mine.text).toBe(theirs.text);
    await page.close();
  });
});
