import type { Metadata } from "next";
import Link from "next/link";
import type { ReactNode } from "react";
import { PanelTable } from "@/components/ui/table";
import { MAX_IMPORT_BYTES, MAX_LISTED_ERRORS } from "@/lib/import/limits";
import { METALS } from "@/lib/scaling/client";
import { HISTOGRAM_COLUMNS, WIRE_CLASS_COLUMNS } from "@/lib/scaling/formats";
import { MAX_CLASSES } from "@/lib/validation/wire-class";

export const metadata: Metadata = { title: "CSV formats" };

/** Limits the app applies on top of the column rules (lib/validation/wire-class.ts). */
const CLASS_LIMITS: Record<string, string> = {
  class: "1–60 characters, unique in the file (ignoring case)",
  width_nm: "> 0, ≤ 100 µm",
  thickness_nm: "> 0, ≤ 100 µm; barrier < thickness",
  spacing_nm: "> 0, ≤ 100 µm",
  ild_below_nm: "> 0, ≤ 100 µm, or empty; at least one of the two ILD heights",
  ild_above_nm: "> 0, ≤ 100 µm, or empty",
  barrier_nm: "≥ 0, < width / 2",
  metal: "an id of the metals catalogue below (case-insensitive)",
  k: "1 … 30",
  net_count: "whole number ≥ 0",
  mean_length_um: "> 0, ≤ 100 mm",
  driver_ohm: "≥ 0",
  load_ff: "≥ 0",
  activity: "0 … 1",
  k_gap: "1 … 30 and ≤ the row's k, or empty",
  gap_fraction: "0 … 1, or empty",
};

const EXAMPLE_CLASS: Record<string, string> = {
  class: "local",
  tier: "local",
  width_nm: "24",
  thickness_nm: "48",
  spacing_nm: "24",
  ild_below_nm: "30",
  ild_above_nm: "30",
  barrier_nm: "2",
  metal: "Cu",
  k: "2.7",
  net_count: "1200000",
  mean_length_um: "4",
  driver_ohm: "8000",
  load_ff: "0.4",
  activity: "0.15",
};

function H2({ id, children }: { id: string; children: ReactNode }) {
  return (
    <h2 id={id} className="mt-8 scroll-mt-4 text-lg font-semibold text-ink">
      {children}
    </h2>
  );
}

function ColumnTable({ rows }: { rows: { name: string; unit: string; required: boolean; description: string; limits?: string; example?: string }[] }) {
  return (
    <PanelTable
      tableClassName="w-full text-sm"
      headClassName="bg-ground text-left text-xs text-muted"
      columns={["column", "unit", "required", "meaning", "accepted values", { label: "example", className: "text-right" }]}
    >
      <tbody>
        {rows.map((c) => (
          <tr key={c.name} className="border-t border-rule align-top">
            <td className="px-3 py-1.5 font-mono text-xs">{c.name}</td>
            <td className="px-3 py-1.5">{c.unit || "—"}</td>
            <td className="px-3 py-1.5">{c.required ? "yes" : "no (may be empty)"}</td>
            <td className="px-3 py-1.5">{c.description}</td>
            <td className="px-3 py-1.5 text-muted">{c.limits ?? ""}</td>
            <td className="px-3 py-1.5 text-right font-mono text-xs tabular">{c.example ?? ""}</td>
          </tr>
        ))}
      </tbody>
    </PanelTable>
  );
}

export default function CsvHelpPage() {
  const mib = MAX_IMPORT_BYTES / (1024 * 1024);
  return (
    <main className="mx-auto max-w-5xl px-4 py-8 text-ink">
      <p className="text-sm">
        <Link href="/" className="font-semibold text-copper-dark">
          Plateau
        </Link>{" "}
        <span className="text-muted">/ Help</span>
      </p>
      <h1 className="mt-2 text-2xl font-semibold">CSV formats: wire classes and length histograms</h1>
      <p className="mt-2 max-w-prose text-sm text-muted">
        Bring your design&apos;s wiring statistics from your own flows. Both files are plain CSV with the unit in each column name; values are plain numbers in
        that unit, with a decimal point. Plateau stores everything in SI units and converts exactly (24 nm is stored as 2.4·10⁻⁸ m, not
        2.4000000000000003·10⁻⁸).
      </p>

      <div className="mt-4 flex flex-wrap gap-3 text-sm">
        <a
          className="rounded-md border border-rule-strong bg-panel px-3 py-1.5 font-medium hover:bg-ground"
          href="/templates/wire-classes-template.csv"
          download
        >
          Download the wire-class template
        </a>
        <a
          className="rounded-md border border-rule-strong bg-panel px-3 py-1.5 font-medium hover:bg-ground"
          href="/templates/length-histograms-template.csv"
          download
        >
          Download the length-histogram template
        </a>
      </div>
      <p className="mt-2 text-xs text-muted">
        The templates hold <strong>invented demo data</strong> (the fictional &quot;Skua&quot; tile of the made-up team Harrow Bay Silicon); no value describes
        a real process, foundry or product.
      </p>

      <H2 id="general">Rules for both files</H2>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-sm">
        <li>
          UTF-8 text. A byte-order mark (BOM) is accepted; other encodings and binary files (for example a workbook saved as .xlsx) are rejected — save as
          &quot;CSV UTF-8&quot;.
        </li>
        <li id="units">
          The unit is part of each column name. Another unit of the same kind is accepted and converted exactly — the decimal exponent is shifted, so{" "}
          <code>0.018</code> in <code>width_um</code> is stored exactly as <code>18</code> in <code>width_nm</code>: every length column in pm, Å (angstrom),
          nm, µm (um, micron), mm, cm or m (e.g. <code>width_um</code>, <code>width (µm)</code>, <code>mean_length_mm</code>, <code>length_nm</code>); the
          resistances in Ω (ohm) or kΩ (kohm), e.g. <code>driver_kohm</code>; the load in aF, fF, pF, nF or F, e.g. <code>load_af</code>. Other units (
          <code>width_mil</code>, the ambiguous <code>driver_mohm</code>) are rejected with &quot;did you mean width_nm? Give the values in nm.&quot;
        </li>
        <li>
          The first line is the header. Column names are matched ignoring case and surrounding spaces (a space inside may stand for the underscore, and the unit
          may stand in parentheses or brackets: <code>width (nm)</code>), in any order. Unknown columns, a column named twice and missing required columns are
          rejected, with the list of expected columns — everywhere the formats are read: the upload, the preview in the browser and the command line (
          <code>npm run scaling -- evaluate --baseline classes.csv</code>) use one reader with one set of rules, so a file gets the same verdict in each.
        </li>
        <li>
          Commas separate fields; a semicolon is used instead when the header clearly uses semicolons (as spreadsheets in some locales save). Numbers always use
          a decimal point. A file written with decimal commas (<code>2,7</code> in a semicolon file, or a stray <code>2,7</code> that splits a comma-separated
          row into one field too many) gets one message that says so, not an error per cell; the import preview offers{" "}
          <strong>Convert to decimal points</strong>, which rewrites the file comma-separated with decimal points digit for digit (<code>1,550</code> →{" "}
          <code>1.550</code>, nothing rounded), checks it again and uploads the converted file.
        </li>
        <li>
          Quoted fields (<code>&quot;a, b&quot;</code>, with <code>&quot;&quot;</code> for a quote), Windows (CRLF) or Unix line ends, blank lines and a
          trailing newline are fine. Every row has as many fields as the header (one empty field after the last is tolerated); a row with more or fewer is an
          error.
        </li>
        <li>
          Numbers must be finite: <code>NaN</code>, <code>Infinity</code> and overflowing values such as <code>1e999</code> are rejected. Exponents (
          <code>1.5e3</code>) are fine.
        </li>
        <li>Nothing is stored unless the whole file is valid: one transaction per import, and a connection lost mid-upload stores nothing.</li>
        <li>
          Errors name the line (the header is line 1), the column, the value and the reason, e.g. <code>line 3, width_nm: &quot;-4&quot; must be &gt; 0</code>.
          The first {MAX_LISTED_ERRORS} errors are listed with the total count; the import page lets you download them as CSV.
        </li>
        <li>Files up to {mib} MiB (about 2.5 million histogram rows). Larger uploads are refused (HTTP 413).</li>
      </ul>

      <H2 id="wire-classes">Wire classes</H2>
      <p className="mt-2 text-sm text-muted">One row per wire class; at most {MAX_CLASSES} classes per baseline.</p>
      <div className="mt-3">
        <ColumnTable rows={WIRE_CLASS_COLUMNS.map((c) => ({ ...c, limits: CLASS_LIMITS[c.name], example: EXAMPLE_CLASS[c.name] }))} />
      </div>
      <pre className="mt-3 overflow-x-auto rounded-md border border-rule bg-panel p-3 font-mono text-xs">
        {WIRE_CLASS_COLUMNS.map((c) => c.name).join(",")}
        {"\n"}
        {WIRE_CLASS_COLUMNS.map((c) => EXAMPLE_CLASS[c.name]).join(",")}
      </pre>
      <h3 className="mt-4 text-sm font-semibold">Replace or merge</h3>
      <ul className="mt-1 list-disc space-y-1 pl-5 text-sm">
        <li>
          <strong>Replace</strong>: the file becomes the class table, in the file&apos;s order. A class whose name (ignoring case) is already in the baseline is
          updated in place and keeps its length histogram; classes not in the file are deleted with their histograms.
        </li>
        <li>
          <strong>Merge</strong>: rows update the classes of the same name and new classes are appended; classes not in the file stay as they are.
        </li>
        <li>The mode is always chosen explicitly (the API answers 400 without it). A new baseline can also be created straight from a file.</li>
      </ul>

      <H2 id="histograms">Length histograms</H2>
      <p className="mt-2 text-sm text-muted">
        Many rows per class: one per length bin. When a class has a histogram, its distribution results (delay distribution, share of nets over the delay
        budget, total repeaters) are computed over the bins instead of putting every net at the mean length. Files of a million rows are fine.
      </p>
      <div className="mt-3">
        <ColumnTable
          rows={HISTOGRAM_COLUMNS.map((c) => ({
            name: c.name,
            unit: c.unit,
            required: c.required,
            description: c.description,
            limits: c.name === "class" ? "an existing class of the baseline; names are case-sensitive" : c.name === "length_um" ? "> 0" : "whole number ≥ 0",
            example: c.name === "class" ? "local" : c.name === "length_um" ? "0.317" : "3553",
          }))}
        />
      </div>
      <ul className="mt-3 list-disc space-y-1 pl-5 text-sm">
        <li>
          <strong>Duplicates</strong>: a class and length may appear only once — a second row for the same bin is an error naming both lines (Plateau does not
          add them up, since a repeated bin is usually a copy-paste slip).
        </li>
        <li>Import the wire classes first: a row naming a class the baseline does not have is an error (with a hint when only the case differs).</li>
        <li>
          <strong>Replace</strong> replaces every class&apos;s histogram (classes not in the file end up with none); <strong>merge</strong> replaces only the
          histograms of the classes in the file. When a histogram&apos;s total differs from the class&apos;s <code>net_count</code>, the import answers a
          warning; the distribution uses the histogram.
        </li>
      </ul>

      <H2 id="metals">Metals catalogue</H2>
      <p className="mt-2 text-sm text-muted">
        The <code>metal</code> column takes one of these ids (or the metal&apos;s name). Values as used by the engine, with their sources
        (lib/scaling/materials.ts).
      </p>
      <PanelTable
        className="mt-3"
        tableClassName="num w-full text-sm"
        headClassName="bg-ground text-left text-xs text-muted"
        columns={[
          "id",
          "metal",
          { label: "bulk resistivity (µΩ·cm)", className: "text-right" },
          { label: "mean free path (nm)", className: "text-right" },
          "resistivity source",
        ]}
      >
        <tbody>
          {Object.values(METALS).map((m) => (
            <tr key={m.id} className="border-t border-rule align-top">
              <td className="px-3 py-1.5 font-mono text-xs">{m.id}</td>
              <td className="px-3 py-1.5">{m.name}</td>
              <td className="px-3 py-1.5 text-right tabular">{Number((m.resistivityOhmM * 1e8).toPrecision(4))}</td>
              <td className="px-3 py-1.5 text-right tabular">{Number((m.meanFreePathM * 1e9).toPrecision(4))}</td>
              <td className="px-3 py-1.5 text-xs text-muted">{m.sources.resistivity}</td>
            </tr>
          ))}
        </tbody>
      </PanelTable>

      <H2 id="export">Export</H2>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-sm">
        <li>
          A baseline&apos;s classes and histograms export in exactly these formats, so an export re-imports unchanged. A scenario&apos;s per-class results
          export with the unit in each header (nm, µm, Ω/µm, fF/µm, ps, fJ, µW).
        </li>
        <li>
          Text cells that a spreadsheet would run as a formula (starting with <code>=</code>, <code>+</code>, <code>-</code>, <code>@</code>, a tab or a
          carriage return) are written with a leading apostrophe; the importer removes it again.
        </li>
      </ul>

      <H2 id="api">API</H2>
      <p className="mt-2 text-sm text-muted">
        Send the file as the body (<code>content-type: text/csv</code>) or as a multipart form with a <code>file</code> field. Editor or owner role; answers are
        JSON.
      </p>
      <pre className="mt-2 overflow-x-auto rounded-md border border-rule bg-panel p-3 font-mono text-xs leading-relaxed">{`POST /api/baselines/{id}/import?mode=replace|merge&version=N[&dryRun=1]       wire classes
POST /api/baselines/{id}/histograms?mode=replace|merge&version=N[&dryRun=1]   length histograms
POST /api/teams/{teamId}/baselines/import?name=…[&dryRun=1]        new baseline from classes
GET  /api/baselines/{id}/export.csv                                  classes (viewer or better)
GET  /api/baselines/{id}/histograms            (JSON) · /histograms/export.csv
GET  /api/scenarios/{id}/results.csv                                 per-class results

curl -X POST -H 'content-type: text/csv' --data-binary @classes.csv \\
  -b 'plateau_session=…' 'https://…/api/baselines/{id}/import?mode=merge&dryRun=1'`}</pre>
      <p className="mt-2 text-sm text-muted">
        An invalid file answers 400 <code>{`{ error: { code: "invalid_csv", message, errors: [{ line, column, value, message }], errorCount } }`}</code>; too
        large 413; a wrong content type 415. <code>version</code> is the baseline version you loaded (<code>GET /api/baselines/{"{id}"}</code>), required unless{" "}
        <code>dryRun=1</code>: if someone saved the baseline since, nothing is stored and the answer is 409{" "}
        <code>{`{ error: { code: "stale_version", message, currentVersion } }`}</code>.
      </p>
    </main>
  );
}
