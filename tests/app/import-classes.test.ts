import { describe, expect, it } from "vitest";
import { Client, userWithTeam } from "../helpers/http";
import {
  type BadCsvCase,
  dbState,
  expectFirstIssue,
  HEADER,
  memberClient,
  ownerWithBaseline,
  postCsv,
  rawCsvPost,
  ROW_GLOBAL,
  ROW_LOCAL,
  sql,
  TEMPLATE_CLASSES,
  withVersion,
} from "./import-helpers";

const enc = new TextEncoder();
const VIA_COLUMNS = "vias_per_net,via_ohm,via_width_nm,via_height_nm";
const GAP_COLUMNS = "k_gap,gap_fraction";

describe("POST /api/baselines/[id]/import (wire classes)", () => {
  it("answers 401 signed out, 404 to another team, 403 to a viewer, and stores nothing", async () => {
    const o = await ownerWithBaseline();
    const before = dbState();
    const url = `/api/baselines/${o.baselineId}/import?mode=replace`;
    const anon = await postCsv(new Client(), url, TEMPLATE_CLASSES);
    expect(anon.status).toBe(401);
    const stranger = await userWithTeam();
    const other = await postCsv(stranger.client, url, TEMPLATE_CLASSES);
    expect(other.status).toBe(404);
    expect(other.json.error.message).toBe("Baseline not found.");
    const viewer = await memberClient(o.teamId, "viewer");
    const v = await postCsv(viewer, url, TEMPLATE_CLASSES);
    expect(v.status).toBe(403);
    expect(dbState()).toEqual(before);
    // a viewer may still export
    const exp = await viewer.get(`/api/baselines/${o.baselineId}/export.csv`);
    expect(exp.status).toBe(200);
    expect((await stranger.client.get(`/api/baselines/${o.baselineId}/export.csv`)).status).toBe(404);
    expect((await new Client().get(`/api/baselines/${o.baselineId}/export.csv`)).status).toBe(401);
  });

  it("lets an editor replace, requires an explicit mode, and records a revision", async () => {
    const o = await ownerWithBaseline();
    const editor = await memberClient(o.teamId, "editor");
    const before = dbState();
    const noMode = await postCsv(editor, `/api/baselines/${o.baselineId}/import`, TEMPLATE_CLASSES);
    expect(noMode.status).toBe(400);
    expect(noMode.json.error.message).toBe("Choose mode=replace or mode=merge explicitly.");
    const badMode = await postCsv(editor, `/api/baselines/${o.baselineId}/import?mode=append`, TEMPLATE_CLASSES);
    expect(badMode.status).toBe(400);
    expect(dbState()).toEqual(before);
    const r = await postCsv(editor, `/api/baselines/${o.baselineId}/import?mode=replace`, `${HEADER}\n${ROW_LOCAL}\n`);
    expect(r.status).toBe(200);
    expect(r.json).toMatchObject({
      ok: true,
      stored: true,
      mode: "replace",
      rows: 1,
      version: 2,
      removed: ["intermediate", "semi-global", "global"],
      updated: ["local"],
    });
    const classes = await editor.get(`/api/baselines/${o.baselineId}/classes`);
    expect(classes.json.classes.map((c: { name: string }) => c.name)).toEqual(["local"]);
    const rev = sql<{ version: number; summary: string }>(
      "select version, summary from baseline_revisions where baseline_id = ? order by version",
      o.baselineId,
    );
    expect(rev.map((x) => x.version)).toEqual([1, 2]);
    expect(rev[1]!.summary).toBe("Imported wire classes from CSV (replace): 1 class; removed intermediate, semi-global, global");
  });

  it("merges by class name: updates, appends, keeps the rest", async () => {
    const o = await ownerWithBaseline();
    const text = `${HEADER}\n${ROW_GLOBAL.replace("global,global,400", "global,global,420")}\nM10-extra,global,500,1000,500,500,,5,Cu,3.0,100,2000,300,5.0,0.1\n`;
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=merge`, text);
    expect(r.status).toBe(200);
    expect(r.json).toMatchObject({ added: ["M10-extra"], updated: ["global"], removed: [] });
    const classes = (await o.client.get(`/api/baselines/${o.baselineId}/classes`)).json.classes as { name: string; widthM: number }[];
    expect(classes.map((c) => c.name)).toEqual(["local", "intermediate", "semi-global", "global", "M10-extra"]);
    expect(classes.find((c) => c.name === "global")!.widthM).toBe(4.2e-7);
  });

  it("dry run validates and answers the summary but stores nothing", async () => {
    const o = await ownerWithBaseline();
    const before = dbState();
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=replace&dryRun=1`, `${HEADER}\n${ROW_LOCAL}\n`);
    expect(r.status).toBe(200);
    expect(r.json).toMatchObject({ ok: true, dryRun: true, stored: false, rows: 1, removed: ["intermediate", "semi-global", "global"] });
    expect(dbState()).toEqual(before);
  });

  it("accepts BOM, CRLF, quotes, semicolons, another column order and a multipart upload", async () => {
    const o = await ownerWithBaseline();
    const cols = HEADER.split(",");
    const order = [...cols.slice(5), ...cols.slice(0, 5)];
    const vals = ROW_LOCAL.split(",");
    const line = order.map((c) => (c === "class" ? '"loc;al"' : vals[cols.indexOf(c)]!)).join(";");
    const text = "\uFEFF" + order.join(";") + "\r\n" + line + "\r\n";
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=merge`, text);
    expect(r.status).toBe(200);
    expect(r.json.delimiter).toBe(";");
    expect(r.json.added).toEqual(["loc;al"]);
    const form = new FormData();
    form.append("note", "ignored");
    form.append("file", new Blob([`${HEADER}\r\n${ROW_LOCAL.replace(/^local/, "from-form")}\r\n`], { type: "text/csv" }), "classes.csv");
    const m = await o.client.req("POST", await withVersion(o.client, `/api/baselines/${o.baselineId}/import?mode=merge`), undefined, { raw: form });
    expect(m.status).toBe(200);
    expect(m.json.added).toEqual(["from-form"]);
  });

  const bad: BadCsvCase[] = [
    [
      "an unknown column",
      `${HEADER},colour\n${ROW_LOCAL},red\n`,
      {
        line: 1,
        column: null,
        message: /^Unknown column "colour"\. Expected columns for wire classes: class, tier, width_nm, thickness_nm, spacing_nm, ild_below_nm \(optional\)/,
      },
    ],
    [
      "a missing required column",
      HEADER.replace(",activity", "") + "\n" + ROW_LOCAL.replace(/,0\.15$/, "") + "\n",
      { line: 1, column: null, message: /^Missing required column activity\. Expected columns/ },
    ],
    [
      "a class name twice",
      `${HEADER}\n${ROW_LOCAL}\n${ROW_LOCAL}\n`,
      { line: 3, column: "class", value: "local", message: "is already defined on line 2 (class names must be unique, ignoring case)" },
    ],
    ["a non-finite number", `${HEADER}\n${ROW_LOCAL.replace(",8000,", ",1e999,")}\n`, { line: 2, column: "driver_ohm", value: "1e999", message: /finite/ }],
    ["NaN", `${HEADER}\n${ROW_LOCAL.replace(",2.7,", ",NaN,")}\n`, { line: 2, column: "k", value: "NaN", message: /number/ }],
    [
      "a negative width",
      `${HEADER}\n${ROW_LOCAL}\n${ROW_GLOBAL.replace("global,global,400", "global,global,-4")}\n`,
      { line: 3, column: "width_nm", value: "-4", message: "must be > 0" },
    ],
    [
      "a decimal comma",
      `${HEADER.replace(/,/g, ";")}\n${ROW_LOCAL.replace(/,/g, ";").replace("2.7", "2,7")}\n`,
      {
        line: null,
        column: "k",
        value: "2,7",
        message:
          /^The file writes numbers with a decimal comma: 1 cell such as "2,7" \(line 2, k\)\. Plateau reads numbers with a decimal point \(2\.7, not 2,7\)\. Convert the file/,
      },
    ],
    [
      "an unknown metal",
      `${HEADER}\n${ROW_LOCAL.replace(",Cu,", ",Mithril,")}\n`,
      {
        line: 2,
        column: "metal",
        value: "Mithril",
        message: /^must be one of Cu, Al, W, Co, Ru \(got "Mithril"\); see the metals catalogue .*\/help\/csv#metals$/,
      },
    ],
    [
      "an unknown tier",
      `${HEADER}\n${ROW_LOCAL.replace("local,local", "local,regional")}\n`,
      { line: 2, column: "tier", value: "regional", message: /^must be one of local, intermediate, semi-global, global$/ },
    ],
    ["an empty file", "", { line: null, column: null, message: "The file is empty." }],
    ["a header without rows", `${HEADER}\r\n`, { line: 2, column: null, message: "The file has a header but no wire classes." }],
    [
      "a binary file",
      new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0, 0, 0x08, 0, 0x63, 0x6c]),
      { line: null, column: null, message: /NUL bytes: it looks like a binary file/ },
    ],
    [
      "invalid UTF-8",
      new Uint8Array([...enc.encode(`${HEADER}\n`), ...enc.encode(ROW_LOCAL).map((b) => (b === 0x43 ? 0xc3 : b)), 0x0a]),
      { line: null, column: null, message: /not valid UTF-8/ },
    ],
    ["a row with too many fields", `${HEADER}\n${ROW_LOCAL},x\n${ROW_GLOBAL}\n`, { line: 2, column: null, message: "has 16 fields, the header has 15" }],
    [
      "a row with a number too many (or a decimal comma)",
      `${HEADER}\n${ROW_LOCAL},1\n${ROW_GLOBAL}\n`,
      {
        line: null,
        column: null,
        message:
          'Line 2 has 16 fields, the header has 15: probably a number written with a decimal comma ("4,8000"), split into two fields in a comma-separated file, or a field too many at the end. Plateau reads numbers with a decimal point (4.8000, not 4,8000): write them so, or save the file from your spreadsheet with "." as the decimal separator.',
      },
    ],
  ];

  it.each(bad)("rejects %s with line, column and reason, changing nothing", async (_name, body, expected) => {
    const o = await ownerWithBaseline();
    const before = dbState();
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=replace`, body);
    expect(r.status).toBe(400);
    expect(r.json.error.code).toBe("invalid_csv");
    expect(r.json.error.message).toMatch(/Nothing was stored\.$/);
    expectFirstIssue(r.json.error.errors[0], expected);
    expect(dbState()).toEqual(before);
  });

  it("answers 415 to another content type and 413 above the limit (declared or streamed), changing nothing", async () => {
    const o = await ownerWithBaseline();
    const before = dbState();
    const t = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=replace`, TEMPLATE_CLASSES, "application/json");
    expect(t.status).toBe(415);
    const url = new URL(o.client.baseUrl + (await withVersion(o.client, `/api/baselines/${o.baselineId}/import?mode=replace`)));
    // Send `totalBytes` of rows and then hold the request open until the server answers. Writing on after the
    // answer races the server's close (EPIPE, or an RST that discards the answer), so the client never does.
    const send = (headers: Record<string, string>, totalBytes: number) =>
      new Promise<{ status: number; body: string }>((resolve, reject) => {
        let answered = false;
        const req = rawCsvPost(o.client, url, headers, (res) => {
          answered = true;
          let body = "";
          res.on("data", (d) => (body += d));
          res.on("end", () => {
            resolve({ status: res.statusCode ?? 0, body });
            req.destroy();
          });
        });
        req.on("error", (e) => {
          if (!answered) reject(e);
        });
        const line = Buffer.from(`${ROW_LOCAL}\n`.repeat(16_000)); // ~1 MiB of rows
        let sent = 0;
        req.write(`${HEADER}\n`);
        const pump = () => {
          while (sent < totalBytes && !answered) {
            sent += line.length;
            if (!req.write(line)) return void req.once("drain", pump);
          }
        };
        pump();
      });
    const declared = await send({ "content-length": String(65 * 1024 * 1024) }, 0);
    expect(declared.status).toBe(413);
    expect(JSON.parse(declared.body).error.message).toMatch(/larger than the limit of 64 MiB/);
    const streamed = await send({ "transfer-encoding": "chunked" }, 65 * 1024 * 1024);
    expect(streamed).toMatchObject({ status: 413 });
    expect(JSON.parse(streamed.body).error.errors[0].message).toBe("The file is larger than the limit of 64 MiB.");
    expect(dbState()).toEqual(before);
  }, 120_000);

  it("creates a new baseline from a CSV (editor+), rejects a taken name with 409", async () => {
    const u = await userWithTeam();
    const viewer = await memberClient(u.teamId, "viewer");
    const before = dbState();
    const v = await postCsv(viewer, `/api/teams/${u.teamId}/baselines/import?name=X`, TEMPLATE_CLASSES);
    expect(v.status).toBe(403);
    expect((await postCsv(new Client(), `/api/teams/${u.teamId}/baselines/import?name=X`, TEMPLATE_CLASSES)).status).toBe(401);
    const noName = await postCsv(u.client, `/api/teams/${u.teamId}/baselines/import`, TEMPLATE_CLASSES);
    expect(noName.status).toBe(400);
    expect(dbState()).toEqual(before);
    const r = await postCsv(u.client, `/api/teams/${u.teamId}/baselines/import?name=Skua%20import`, TEMPLATE_CLASSES);
    expect(r.status).toBe(201);
    expect(r.json.baseline.name).toBe("Skua import");
    expect(r.json.classes).toHaveLength(4);
    const mid = dbState();
    const again = await postCsv(u.client, `/api/teams/${u.teamId}/baselines/import?name=skua%20IMPORT`, TEMPLATE_CLASSES);
    expect(again.status).toBe(409);
    expect(again.json.error.message).toBe('A baseline named "skua IMPORT" already exists in this team.');
    expect(dbState()).toEqual(mid);
  });

  it("round-trips the optional via columns; files without them keep working", async () => {
    const o = await ownerWithBaseline();
    const csv = `${HEADER},${VIA_COLUMNS}\n${ROW_LOCAL},2,,20,35\n${ROW_GLOBAL},3,4.5,,\n`;
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=replace`, csv);
    expect(r.status).toBe(200);
    const cols = "name, vias_per_net, via_ohm, via_width_m, via_height_m";
    const a = sql(`select ${cols} from wire_classes where baseline_id = ? order by position`, o.baselineId);
    expect(a).toEqual([
      { name: "local", vias_per_net: 2, via_ohm: null, via_width_m: 2e-8, via_height_m: 3.5e-8 },
      { name: "global", vias_per_net: 3, via_ohm: 4.5, via_width_m: null, via_height_m: null },
    ]);
    const got = await o.client.get(`/api/baselines/${o.baselineId}`);
    expect(got.json.baseline.classes[1]).toMatchObject({ viasPerNet: 3, viaOhm: 4.5 });
    expect(got.json.baseline.classes[1]).not.toHaveProperty("viaWidthM");
    const exp = await o.client.get(`/api/baselines/${o.baselineId}/export.csv`);
    expect(exp.text).toContain(`${ROW_LOCAL},2,,20,35,,\r\n`);
    const back = await postCsv(o.client, `/api/teams/${o.teamId}/baselines/import?name=Vias%20copy`, exp.text);
    expect(back.status).toBe(201);
    expect(sql(`select ${cols} from wire_classes where baseline_id = ? order by position`, back.json.baseline.id)).toEqual(a);
    // a bad via cell names line and column, and nothing is stored
    const before = dbState();
    const bad = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=replace`, `${HEADER},vias_per_net\n${ROW_LOCAL},1.5\n`);
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.json.error)).toMatch(/vias_per_net/);
    expect(dbState()).toEqual(before);
    // merging a file without via columns into classes with vias: the merged rows carry no vias, as the file says
    const plain = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=merge`, `${HEADER}\n${ROW_LOCAL}\n`);
    expect(plain.status).toBe(200);
    expect(sql(`select ${cols} from wire_classes where baseline_id = ? order by position`, o.baselineId)[0]).toEqual({
      name: "local",
      vias_per_net: null,
      via_ohm: null,
      via_width_m: null,
      via_height_m: null,
    });
  });
});

describe("decimal commas and header units (issue 13 items 8, 9)", () => {
  const semicolonCommas = (text: string) => text.replace(/,/g, ";").replace(/(\d)\.(\d)/g, "$1,$2");

  it("a semicolon file with decimal commas answers one clear 400 (not one error per cell) and stores nothing", async () => {
    const o = await ownerWithBaseline();
    const before = dbState();
    const cells = (TEMPLATE_CLASSES.match(/\d\.\d/g) ?? []).length;
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=replace`, semicolonCommas(TEMPLATE_CLASSES));
    expect(r.status).toBe(400);
    expect(r.json.error.code).toBe("invalid_csv");
    expect(r.json.error.errorCount).toBe(1);
    expect(r.json.error.errors).toHaveLength(1);
    expect(r.json.error.message).toBe(
      `The file writes numbers with a decimal comma: ${cells} cells such as "2,7" (line 2, k). Plateau reads numbers with a decimal point (2.7, not 2,7). Convert the file in the import preview ("Convert to decimal points" rewrites it comma-separated with decimal points, exactly), or save it from your spreadsheet with "." as the decimal separator. Nothing was stored.`,
    );
    expect(dbState()).toEqual(before);
    // the same for a new baseline from such a file: no baseline is created
    const n = await postCsv(o.client, `/api/teams/${o.teamId}/baselines/import?name=Komma`, semicolonCommas(TEMPLATE_CLASSES));
    expect(n.status).toBe(400);
    expect(n.json.error.errorCount).toBe(1);
    expect(n.json.error.message).toMatch(/^The file writes numbers with a decimal comma/);
    expect(dbState()).toEqual(before);
  });

  it("a decimal comma splitting a comma-separated row answers one 400 naming it, instead of 'has 16 fields'", async () => {
    const o = await ownerWithBaseline();
    const before = dbState();
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=merge`, `${HEADER}\n${ROW_LOCAL.replace(",0.4,", ",0,4,")}\n${ROW_GLOBAL}\n`);
    expect(r.status).toBe(400);
    expect(r.json.error.errorCount).toBe(1);
    expect(r.json.error.message).toBe(
      'Line 2 has 16 fields, the header has 15: probably a number written with a decimal comma ("4,8000" or "8000,0" or "0,4"), split into two fields in a comma-separated file. Plateau reads numbers with a decimal point (1.55, not 1,55): write them so, or save the file from your spreadsheet with "." as the decimal separator. Nothing was stored.',
    );
    expect(dbState()).toEqual(before);
  });

  it("a header in µm, mm, kΩ and aF is converted exactly: the stored classes equal those of the nm/µm/Ω/fF file", async () => {
    const o = await ownerWithBaseline();
    const other =
      "class,tier,width (µm),thickness_um,spacing_um,ild_below_um,ild_above_um,barrier_um,metal,k,net_count,mean_length_mm,driver (kΩ),load_af,activity\n" +
      "local,local,0.018,0.048,0.024,0.03,0.03,0.002,Cu,2.7,1200000,0.004,8,400,0.15\n";
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=merge`, other);
    expect(r.status).toBe(200);
    const row = sql<Record<string, number>>(
      "select width_m, thickness_m, spacing_m, ild_below_m, barrier_m, mean_length_m, driver_ohm, load_f from wire_classes where baseline_id = ? and name = 'local'",
      o.baselineId,
    )[0]!;
    // 0.018 µm is 1.8e-8 m exactly (a float multiply, 0.018 * 1000 * 1e-9, would store 1.8000000000000002e-8)
    expect(row).toEqual({
      width_m: 1.8e-8,
      thickness_m: 4.8e-8,
      spacing_m: 2.4e-8,
      ild_below_m: 3e-8,
      barrier_m: 2e-9,
      mean_length_m: 4e-6,
      driver_ohm: 8000,
      load_f: 4e-16,
    });
    const hint = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=merge`, `${HEADER.replace("driver_ohm", "driver_mohm")}\n${ROW_LOCAL}\n`);
    expect(hint.status).toBe(400);
    expect(hint.json.error.errors[0].message).toMatch(/^Unknown column "driver_mohm" \(did you mean driver_ohm\? Give the values in Ω\.\)\./);
  });
});

describe("air-gap columns (issue 11): k_gap, gap_fraction", () => {
  it("stores them, round-trips them through export and import, and leaves classes without them unchanged", async () => {
    const o = await ownerWithBaseline();
    const csv = `${HEADER},${GAP_COLUMNS}\n${ROW_LOCAL},1,0.6\n${ROW_GLOBAL},1.5,\n`;
    const r = await postCsv(o.client, `/api/baselines/${o.baselineId}/import?mode=replace`, csv);
    expect(r.status, r.text).toBe(200);
    const cols = "name, k_gap, gap_fraction, vias_per_net";
    const a = sql(`select ${cols} from wire_classes where baseline_id = ? order by position`, o.baselineId);
    expect(a).toEqual([
      { name: "local", k_gap: 1, gap_fraction: 0.6, vias_per_net: null },
      { name: "global", k_gap: 1.5, gap_fraction: null, vias_per_net: null },
    ]);
    const got = await o.client.get(`/api/baselines/${o.baselineId}`);
    expect(got.json.baseline.classes[0]).toMatchObject({ kGap: 1, gapFraction: 0.6 });
    expect(got.json.baseline.classes[1]).toMatchObject({ kGap: 1.5 });
    expect(got.json.baseline.classes[1]).not.toHaveProperty("gapFraction");
    const exp = await o.client.get(`/api/baselines/${o.baselineId}/export.csv`);
    expect(exp.text.split("\r\n")[0]).toBe(`${HEADER},${VIA_COLUMNS},${GAP_COLUMNS}`);
    expect(exp.text).toContain(`${ROW_LOCAL},,,,,1,0.6\r\n`);
    expect(exp.text).toContain(`${ROW_GLOBAL.replace(",3.0,", ",3,").replace(",5.0,", ",5,")},,,,,1.5,\r\n`);
    const back = await postCsv(o.client, `/api/teams/${o.teamId}/baselines/import?name=Air%20copy`, exp.text);
    expect(back.status, back.text).toBe(201);
    expect(sql(`select ${cols} from wire_classes where baseline_id = ? order by position`, back.json.baseline.id)).toEqual(a);
    // the JSON class table of the copy equals the original's, field for field
    const copy = await o.client.get(`/api/baselines/${back.json.baseline.id}`);
    const strip = (cs: Record<string, unknown>[]) => cs.map(({ id: _i, ...c }) => c);
    expect(strip(copy.json.baseline.classes)).toEqual(strip(got.json.baseline.classes));
  });

  it("rejects k_gap above the row's k and a gap_fraction above 1, naming line and column, and stores nothing", async () => {
    const o = await ownerWithBaseline();
    const before = dbState();
    const bad = await postCsv(
      o.client,
      `/api/baselines/${o.baselineId}/import?mode=replace`,
      `${HEADER},${GAP_COLUMNS}\n${ROW_LOCAL},2.8,0.5\n${ROW_GLOBAL},1,1.2\n`,
    );
    expect(bad.status).toBe(400);
    expect(bad.json.error.errors).toEqual([
      { line: 2, column: "k_gap", value: "2.8", message: "must not exceed k (2.7)" },
      { line: 3, column: "gap_fraction", value: "1.2", message: "must be ≤ 1" },
    ]);
    expect(dbState()).toEqual(before);
  });
});

describe("GET /api/baselines/[id]/export.csv", () => {
  it("round-trips: export → import into a new baseline gives identical classes", async () => {
    const o = await ownerWithBaseline();
    // a name that would be a formula in a spreadsheet survives neutralising
    const add = await postCsv(
      o.client,
      `/api/baselines/${o.baselineId}/import?mode=merge`,
      `${HEADER}\n"=HYPERLINK(""x"")",global,410.5,800.25,400,400,,5,Ru,1.9,12345,1500.125,300,5.5,0.05\n`,
    );
    expect(add.status).toBe(200);
    const exp = await o.client.get(`/api/baselines/${o.baselineId}/export.csv`);
    expect(exp.status).toBe(200);
    expect(exp.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(exp.headers.get("content-disposition")).toContain("Skua-wire-classes.csv");
    expect(exp.text.split("\r\n")[0]).toBe(`${HEADER},${VIA_COLUMNS},${GAP_COLUMNS}`);
    expect(exp.text).toContain(`"'=HYPERLINK(""x"")",global,410.5,800.25,`);
    // a file without via or air-gap columns stores none; the export writes them empty
    expect(exp.text).toContain("local,local,24,48,24,30,30,2,Cu,2.7,1200000,4,8000,0.4,0.15,,,,,,\r\n");
    const r = await postCsv(o.client, `/api/teams/${o.teamId}/baselines/import?name=Copy`, exp.text);
    expect(r.status).toBe(201);
    const cols =
      "position, name, tier, width_m, thickness_m, spacing_m, ild_below_m, ild_above_m, barrier_m, metal, k, net_count, mean_length_m, driver_ohm, load_f, activity";
    const a = sql(`select ${cols} from wire_classes where baseline_id = ? order by position`, o.baselineId);
    const b = sql(`select ${cols} from wire_classes where baseline_id = ? order by position`, r.json.baseline.id);
    expect(b).toEqual(a);
    expect(a.map((x) => x.name)).toContain('=HYPERLINK("x")');
  });
});
