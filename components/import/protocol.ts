import type { DecimalCommaFinding } from "@/lib/import/decimal-comma";
import type { ImportIssue } from "@/lib/import/types";

export type ImportKind = "classes" | "histograms";

export interface WorkerRequest {
  kind: ImportKind;
  file: File;
  classNames: string[];
  /** Rewrite the file's decimal commas as decimal points, comma-separated (convertDecimalCommas), then check the result. */
  convertDecimalCommas?: boolean;
}

export interface ClassTotalRow {
  name: string;
  tier?: string;
  nets: number;
  bins?: number;
  minLengthM?: number;
  maxLengthM?: number;
}

export type WorkerMessage =
  | { type: "progress"; bytes: number; total: number }
  | {
      type: "done";
      header: string[];
      preview: { line: number; cells: string[] }[];
      rows: number;
      bytes: number;
      delimiter: string;
      errors: ImportIssue[];
      errorCount: number;
      totals: ClassTotalRow[];
      /** Decimal commas found (one issue in `errors`), and whether the preview can convert the file. */
      decimalCommas: DecimalCommaFinding | null;
      /** The converted file, when the request asked for a conversion: the one to preview and upload. */
      converted?: File;
    }
  | { type: "fatal"; issue: ImportIssue };
