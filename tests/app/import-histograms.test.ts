import Papa from "papaparse";
import fs from "node:fs";
import os from "node:os";
import { describe, expect, it } from "vitest";
import { Client, userWithTeam } from "../helpers/http";
import { decodeHistogram } from "@/db/histogram-blob";
import {
  type BadCsvCase,
  dbState,
  expectFirstIssue,
  rawCsvPost,
  memberClient,
  ownerWithBaseline,
  postCsv,
  sql,
  TEMPLATE_HISTOGRAMS,
  withVersion,
} from "./import-helpers";

const H = "class,length_um,count";

function spoolDirs(): string[] {
  return fs.readdirSync(os.tmpdir()).filter((d) => d.startsWith("plateau-import-"));
}

describe("POST /api/baselines/[id]/histograms", () => {
  it("stores the template histograms, serves them as JSON and CSV, and they drive the distribution results", async () => {
    const o = await ownerWithBaseline();
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, TEMPLATE_HISTOGRAMS);
    expect(r.status).toBe(200);
    expect(r.json).toMatchObject({ ok: true, stored: true, rows: 192, version: 2 });
    expect(r.json.classes.map((c: { name: string; bins: number }) => [c.name, c.bins])).toEqual([
      ["local", 48],
      ["intermediate", 48],
      ["semi-global", 48],
      ["global", 48],
    ]);
    const viewer = await memberClient(o.teamId, "viewer");
    const j = await viewer.get(`/api/baselines/${o.baselineId}/histograms`);
    expect(j.status).toBe(200);
    expect(j.json.classes[0].name).toBe("local");
    expect(j.json.classes[0].bins[0]).toEqual({ lengthUm: 0.317, count: 3553 });
    const csv = await viewer.get(`/api/baselines/${o.baselineId}/histograms/export.csv`);
    expect(csv.status).toBe(200);
    expect(csv.text.replace(/\r\n/g, "\n")).toBe(TEMPLATE_HISTOGRAMS.replace(/\r\n/g, "\n"));
    // a scenario on this baseline: its results CSV is computed from the histograms
    const s = await o.client.post(`/api/teams/${o.teamId}/scenarios`, { baselineId: o.baselineId, name: "Shrink" });
    expect(s.status).toBe(201);
    const res = await viewer.get(`/api/scenarios/${s.json.scenario.id}/results.csv`);
    expect(res.status).toBe(200);
    const [head, ...rows] = res.text.trim().split("\r\n");
    expect(head).toContain("delay_ps");
    expect(head).toContain("c_ff_per_um");
    const cols = head!.split(",");
    const src = cols.indexOf("distribution_source");
    const nets = cols.indexOf("nets");
    expect(rows.map((l) => l.split(",")[src])).toEqual(["histogram", "histogram", "histogram", "histogram"]);
    expect(Number(rows[0]!.split(",")[nets])).toBe(r.json.classes[0].nets);
    // engine 2 columns, appended after the earlier ones; values as the server's evaluation of the same scenario (POST evaluate)
    expect(cols.slice(-6)).toEqual(["repeater_count", "repeater_size", "repeater_area_um2", "repeater_energy_fj", "via_ohm", "temperature_c"]);
    expect(cols.indexOf("validity_flags")).toBe(cols.length - 7);
    const table = Papa.parse<string[]>(res.text, { skipEmptyLines: true }).data;
    const ev = (await viewer.post(`/api/scenarios/${s.json.scenario.id}/evaluate`)).json.evaluation;
    const at = (name: string) => cols.indexOf(name);
    const global = table.find((row) => row[0] === "global")!;
    const g = ev.classes.find((c: { name: string }) => c.name === "global").scenario;
    expect(g.repeaterCount).toBeGreaterThan(0); // the template's 1.5 mm global net is repeated
    expect(Number(global[at("repeater_count")])).toBe(g.repeaterCount);
    expect(Number(global[at("repeater_size")])).toBe(g.repeaterSize);
    expect(Number(global[at("repeater_area_um2")])).toBeCloseTo(g.repeaterAreaM2 * 1e12, 9);
    expect(Number(global[at("repeater_energy_fj")])).toBeCloseTo(g.repeaterEnergyJ * 1e15, 9);
    expect(Number(global[at("via_ohm")])).toBe(0);
    expect(Number(global[at("temperature_c")])).toBe(25);
    expect((await new Client().get(`/api/scenarios/${s.json.scenario.id}/results.csv`)).status).toBe(401);
    expect((await (await userWithTeam()).client.get(`/api/scenarios/${s.json.scenario.id}/results.csv`)).status).toBe(404);
  });

  it("round-trips: histogram export → import into the copy gives identical bins", async () => {
    const o = await ownerWithBaseline();
    await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, TEMPLATE_HISTOGRAMS);
    const classes = await o.client.get(`/api/baselines/${o.baselineId}/export.csv`);
    const bins = await o.client.get(`/api/baselines/${o.baselineId}/histograms/export.csv`);
    const copy = await postCsv(o.client, `/api/teams/${o.teamId}/baselines/import?name=Copy`, classes.text);
    const r = await postCsv(o.client, `/api/baselines/${copy.json.baseline.id}/histograms?mode=replace`, bins.text);
    expect(r.status).toBe(200);
    const q =
      "select c.name, h.bin_count, h.net_count, h.lengths_m, h.counts from class_histograms h join wire_classes c on c.id = h.class_id where c.baseline_id = ? order by c.position";
    const copied = sql<{ name: string; bin_count: number; net_count: number; lengths_m: Buffer; counts: Buffer }>(q, copy.json.baseline.id);
    expect(copied.map((x) => [x.name, x.bin_count])).toEqual([
      ["local", 48],
      ["intermediate", 48],
      ["semi-global", 48],
      ["global", 48],
    ]);
    expect(copied).toEqual(sql(q, o.baselineId));
    // and the blobs decode to the template's bins
    expect(decodeHistogram(copied[0]!).lengthsM[0]).toBe(3.17e-7);
  });

  it("merge replaces only the classes in the file; replace clears the others", async () => {
    const o = await ownerWithBaseline();
    await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, TEMPLATE_HISTOGRAMS);
    const m = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=merge`, `${H}\nglobal,100,5\nglobal,200,6\n`);
    expect(m.status).toBe(200);
    expect(m.json.warnings[0]).toMatch(/^Class "global": the histogram holds 11 nets, the class table says 4,000/);
    const count = () =>
      Object.fromEntries(
        sql<{ name: string; n: number }>(
          "select c.name, coalesce(h.bin_count, 0) as n from wire_classes c left join class_histograms h on h.class_id = c.id where c.baseline_id = ?",
          o.baselineId,
        ).map((x) => [x.name, x.n]),
      );
    expect(count()).toEqual({ local: 48, intermediate: 48, "semi-global": 48, global: 2 });
    const g = sql<{ bin_count: number; net_count: number; lengths_m: Buffer; counts: Buffer }>(
      "select h.* from class_histograms h join wire_classes c on c.id = h.class_id where c.baseline_id = ? and c.name = 'global'",
      o.baselineId,
    )[0]!;
    const gh = decodeHistogram(g);
    expect([[...gh.lengthsM], [...gh.counts], g.net_count]).toEqual([[1e-4, 2e-4], [5, 6], 11]);
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, `${H}\nlocal,1,1\n`);
    expect(r.status).toBe(200);
    expect(count()).toEqual({ local: 1, intermediate: 0, "semi-global": 0, global: 0 });
  });

  it("roles: viewer 403, other team 404, signed out 401 — nothing stored", async () => {
    const o = await ownerWithBaseline();
    const before = dbState();
    const url = `/api/baselines/${o.baselineId}/histograms?mode=replace`;
    expect((await postCsv(new Client(), url, TEMPLATE_HISTOGRAMS)).status).toBe(401);
    expect((await postCsv((await userWithTeam()).client, url, TEMPLATE_HISTOGRAMS)).status).toBe(404);
    expect((await postCsv(await memberClient(o.teamId, "viewer"), url, TEMPLATE_HISTOGRAMS)).status).toBe(403);
    expect((await new Client().get(`/api/baselines/${o.baselineId}/histograms`)).status).toBe(401);
    expect((await (await userWithTeam()).client.get(`/api/baselines/${o.baselineId}/histograms/export.csv`)).status).toBe(404);
    expect(dbState()).toEqual(before);
    const editor = await memberClient(o.teamId, "editor");
    expect((await postCsv(editor, url, TEMPLATE_HISTOGRAMS)).status).toBe(200);
  });

  it("keeps every warning it answers on the baseline until dismissed; a later import of the class supersedes it (issue 13 item 2)", async () => {
    const o = await ownerWithBaseline();
    // 699,999 nets in the histogram of a class whose table says 700,000 (the template's intermediate class count is replaced below)
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=merge`, `${H}\nglobal,100,3999\nlocal,2,5\n`);
    expect(r.status).toBe(200);
    expect(r.json.warnings).toHaveLength(2);
    const list = await o.client.get(`/api/baselines/${o.baselineId}/warnings`);
    expect(list.status).toBe(200);
    // stored in the order the import answered them (the class table's order)
    expect(list.json.warnings.map((w: { message: string }) => w.message)).toEqual(r.json.warnings);
    expect(list.json.warnings.map((w: { className: string }) => w.className)).toEqual(["local", "global"]);
    expect(list.json.warnings[1].message).toMatch(/^Class "global": the histogram holds 3,999 nets, the class table says 4,000/);
    // a viewer reads them but cannot dismiss; another team sees nothing; signed out 401
    const viewer = await memberClient(o.teamId, "viewer");
    expect((await viewer.get(`/api/baselines/${o.baselineId}/warnings`)).json.warnings).toHaveLength(2);
    const [l, g] = list.json.warnings as { id: string }[];
    const before = dbState();
    expect((await viewer.del(`/api/baselines/${o.baselineId}/warnings/${g!.id}`)).status).toBe(403);
    expect((await (await userWithTeam()).client.del(`/api/baselines/${o.baselineId}/warnings/${g!.id}`)).status).toBe(404);
    expect((await new Client().get(`/api/baselines/${o.baselineId}/warnings`)).status).toBe(401);
    expect(dbState()).toEqual(before);
    // dismiss one: gone from the list, a second dismiss is 404 and changes nothing
    expect((await o.client.del(`/api/baselines/${o.baselineId}/warnings/${g!.id}`)).status).toBe(204);
    expect((await o.client.get(`/api/baselines/${o.baselineId}/warnings`)).json.warnings.map((w: { id: string }) => w.id)).toEqual([l!.id]);
    const after = dbState();
    const again = await o.client.del(`/api/baselines/${o.baselineId}/warnings/${g!.id}`);
    expect([again.status, again.json.error.code]).toEqual([404, "not_found"]);
    expect(dbState()).toEqual(after);
    // a merge of "local" whose counts now match supersedes the local warning; nothing new is stored
    const localNets = sql<{ net_count: number }>("select net_count from wire_classes where baseline_id = ? and name = 'local'", o.baselineId)[0]!.net_count;
    const ok = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=merge`, `${H}\nlocal,2,${localNets}\n`);
    expect([ok.status, ok.json.warnings]).toEqual([200, []]);
    expect((await o.client.get(`/api/baselines/${o.baselineId}/warnings`)).json.warnings).toEqual([]);
  });

  it("an invalid histogram file stores no warning", async () => {
    const o = await ownerWithBaseline();
    const before = dbState();
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=merge`, `${H}\nglobal,100,3999\nM42,1,2\n`);
    expect(r.status).toBe(400);
    expect(sql("select * from baseline_warnings where baseline_id = ?", o.baselineId)).toEqual([]);
    expect(dbState()).toEqual(before);
  });

  const bad: BadCsvCase[] = [
    [
      "an unknown class",
      `${H}\nlocal,1,2\nM42,1,2\n`,
      {
        line: 3,
        column: "class",
        value: "M42",
        message: "is not a class of this baseline; known classes: local, intermediate, semi-global, global",
      },
    ],
    [
      "the same class and length twice",
      `${H}\nlocal,1,2\nglobal,3,1\nlocal,1.0,3\n`,
      {
        line: 4,
        column: "length_um",
        value: "1.0",
        message: 'repeats the bin of class "local" at this length from line 2 (one row per class and length)',
      },
    ],
    ["a negative length", `${H}\nlocal,-4,2\n`, { line: 2, column: "length_um", value: "-4", message: "must be > 0" }],
    ["a non-finite count", `${H}\nlocal,1,Infinity\n`, { line: 2, column: "count", value: "Infinity", message: "must be a finite number" }],
    ["a fractional count", `${H}\nlocal,1,2.5\n`, { line: 2, column: "count", value: "2.5", message: "must be a whole number" }],
    [
      "an unknown column",
      `class,length_um,count,weight\nlocal,1,2,3\n`,
      { line: 1, column: null, message: 'Unknown column "weight". Expected columns for length histograms: class, length_um, count.' },
    ],
    [
      "a missing column",
      `class,length_um\nlocal,1\n`,
      { line: 1, column: null, message: "Missing required column count. Expected columns for length histograms: class, length_um, count." },
    ],
    ["an empty file", "", { line: null, column: null, message: "The file is empty." }],
    ["a binary file", new Uint8Array([0x1f, 0x8b, 0x08, 0x00, 0x00, 0x00]), { line: null, column: null, message: /NUL bytes/ }],
    ["invalid UTF-8", new Uint8Array([0x63, 0x6c, 0x61, 0x73, 0x73, 0xff, 0xfe, 0x0a]), { line: null, column: null, message: /not valid UTF-8/ }],
  ];

  it.each(bad)("rejects %s, naming line, column and reason, changing nothing", async (_n, body, exp) => {
    const o = await ownerWithBaseline();
    await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, TEMPLATE_HISTOGRAMS);
    const before = dbState();
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, body);
    expect(r.status).toBe(400);
    expectFirstIssue(r.json.error.errors[0], exp);
    expect(dbState()).toEqual(before);
  });

  it("a semicolon file with decimal commas answers one clear 400 and stores nothing; a header in nm stores the same bins as µm (issue 13 items 8, 9)", async () => {
    const o = await ownerWithBaseline();
    await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, TEMPLATE_HISTOGRAMS);
    const before = dbState();
    const semi = TEMPLATE_HISTOGRAMS.replace(/,/g, ";").replace(/(\d)\.(\d)/g, "$1,$2");
    const cells = (TEMPLATE_HISTOGRAMS.match(/\d\.\d/g) ?? []).length;
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, semi);
    expect(r.status).toBe(400);
    expect(r.json.error.errorCount).toBe(1);
    expect(r.json.error.message).toMatch(
      new RegExp(`^The file writes numbers with a decimal comma: ${cells} cells such as "0,317" \\(line 2, length_um\\)\\. .* Nothing was stored\\.$`),
    );
    expect(dbState()).toEqual(before);
    const split = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, `${H}\nlocal,0,5,10\nlocal,1,3\n`);
    expect(split.status).toBe(400);
    expect(split.json.error.errors).toHaveLength(1);
    expect(split.json.error.message).toMatch(/^Line 2 has 4 fields, the header has 3: probably a number written with a decimal comma \("0,5"\)/);
    expect(dbState()).toEqual(before);
    // the template in nm (each length written as 0.317e3 nm for 0.317 µm): exactly the bins the µm file stored
    const stored = () =>
      sql<{ name: string; lengths_m: Buffer; counts: Buffer }>(
        "select c.name, h.lengths_m, h.counts from class_histograms h join wire_classes c on c.id = h.class_id where c.baseline_id = ? order by c.position",
        o.baselineId,
      );
    const inUm = stored();
    const nm = TEMPLATE_HISTOGRAMS.replace("length_um", "length (nm)").replace(/^([^,\n]+),([0-9.]+),/gm, (_m, c: string, v: string) => `${c},${v}e3,`);
    const n = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, nm);
    expect(n.status).toBe(200);
    expect(stored()).toEqual(inUm);
  });

  it("lists the first 200 errors with the total count", async () => {
    const o = await ownerWithBaseline();
    const before = dbState();
    let text = `${H}\n`;
    for (let i = 1; i <= 1000; i++) text += `local,${i},-1\n`;
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, text);
    expect(r.status).toBe(400);
    expect(r.json.error.errors).toHaveLength(200);
    expect(r.json.error.errorCount).toBe(1000);
    expect(r.json.error.message).toBe("The file has 1,000 errors (the first 200 are listed). Nothing was stored.");
    expect(dbState()).toEqual(before);
  });

  it("dry run stores nothing", async () => {
    const o = await ownerWithBaseline();
    const before = dbState();
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace&dryRun=1`, TEMPLATE_HISTOGRAMS);
    expect(r.status).toBe(200);
    expect(r.json).toMatchObject({ dryRun: true, stored: false, rows: 192 });
    expect(dbState()).toEqual(before);
  });

  it("a request killed mid-upload leaves nothing behind (no rows, no spool file)", async () => {
    const o = await ownerWithBaseline();
    await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`, TEMPLATE_HISTOGRAMS);
    const before = dbState();
    const spoolsBefore = spoolDirs();
    const url = new URL(o.client.baseUrl + (await withVersion(o.client, `/api/baselines/${o.baselineId}/histograms?mode=replace`)));
    let line = "";
    for (let i = 1; i <= 2000; i++) line += `local,${i},${i}\n`;
    const chunk = Buffer.from(line); // ~25 kB per write
    await new Promise<void>((resolve) => {
      const req = rawCsvPost(o.client, url, { "transfer-encoding": "chunked" }, () => resolve());
      req.on("error", () => resolve());
      req.write(`${H}\n`);
      let n = 0;
      const tick = () => {
        // about 5 MB sent, then the client dies before finishing the body
        if (n++ < 200) req.write(chunk, () => setImmediate(tick));
        else {
          req.destroy();
          resolve();
        }
      };
      tick();
    });
    await new Promise((r) => setTimeout(r, 1500));
    expect(dbState()).toEqual(before);
    expect(spoolDirs()).toEqual(spoolsBefore);
    // the server is fine and the next import works
    const ok = await postCsv(o.client, `/api/baselines/${o.baselineId}/histograms?mode=merge`, `${H}\nlocal,1,1\n`);
    expect(ok.status).toBe(200);
  });
});
