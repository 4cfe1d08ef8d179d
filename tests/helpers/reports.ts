import { expect } from "vitest";
import type { Client } from "./http";

/** Three invented wire classes (SI strings with units, as the workspace API accepts them). */
export function testClasses(names: [string, string, string] = ["M1 local", "M3 intermediate", "M8 global"]) {
  return [
    {
      name: names[0],
      tier: "local",
      widthM: "24 nm",
      thicknessM: "48 nm",
      spacingM: "24 nm",
      ildBelowM: "40 nm",
      ildAboveM: "40 nm",
      barrierM: "2.5 nm",
      metal: "Cu",
      k: 2.7,
      netCount: 400000,
      meanLengthM: "6 µm",
      driverOhm: "4 kohm",
      loadF: "0.4 fF",
      activity: 0.15,
    },
    {
      name: names[1],
      tier: "intermediate",
      widthM: "40 nm",
      thicknessM: "80 nm",
      spacingM: "40 nm",
      ildBelowM: "70 nm",
      ildAboveM: "70 nm",
      barrierM: "3 nm",
      metal: "Cu",
      k: 2.7,
      netCount: 60000,
      meanLengthM: "60 µm",
      driverOhm: "2 kohm",
      loadF: "1 fF",
      activity: 0.12,
    },
    {
      name: names[2],
      tier: "global",
      widthM: "400 nm",
      thicknessM: "800 nm",
      spacingM: "400 nm",
      ildBelowM: "600 nm",
      ildAboveM: null,
      barrierM: "5 nm",
      metal: "Cu",
      k: 3.0,
      netCount: 2000,
      meanLengthM: "1.5 mm",
      driverOhm: "300 ohm",
      loadF: "5 fF",
      activity: 0.2,
    },
  ];
}

/** A baseline with three classes and three scenarios through the workspace API; returns their ids. */
export async function makeWorkspace(
  c: Client,
  teamId: string,
  opts: { baselineName?: string; classNames?: [string, string, string]; scenarioNames?: [string, string, string] } = {},
) {
  const classes = testClasses(opts.classNames);
  const b = await c.post(`/api/teams/${teamId}/baselines`, {
    name: opts.baselineName ?? `Tile ${Math.random().toString(36).slice(2, 8)}`,
    description: "invented test data",
    classes,
  });
  expect(b.status, b.text).toBe(201);
  const baselineId = b.json.baseline.id as string;
  const [n1, n2, n3] = opts.scenarioNames ?? ["Plain shrink 0.7x", "Shrink + air gap", "Shrink + Ru local"];
  const mid = classes[1]!.name;
  const loc = classes[0]!.name;
  const specs = [
    { name: n1, notes: "0.7x pitch", settings: { s: 1 / 0.7, sL: 1 } },
    { name: n2, notes: "air gap on the intermediate tier", settings: { s: 1 / 0.7, sL: 1, overrides: { [mid]: { k: 1.9 } } } },
    { name: n3, notes: "ruthenium on local wires", settings: { s: 1 / 0.7, sL: 1, overrides: { [loc]: { metal: "Ru" } } } },
  ];
  const scenarioIds: string[] = [];
  for (const s of specs) {
    const r = await c.post(`/api/teams/${teamId}/scenarios`, { baselineId, ...s });
    expect(r.status, r.text).toBe(201);
    scenarioIds.push(r.json.scenario.id as string);
  }
  return { baselineId, scenarioIds, classNames: classes.map((x) => x.name) };
}

/** Decode a quoted-printable mail body well enough to find links in it. */
export function decodeQuotedPrintable(raw: string): string {
  return raw.replace(/=\r?\n/g, "").replace(/=([0-9A-F]{2})/g, (_m, h: string) => String.fromCharCode(parseInt(h, 16)));
}
