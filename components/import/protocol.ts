import type { ImportIssue } from "@/lib/import/types";

export type ImportKind = "classes" | "histograms";

export interface WorkerRequest {
  kind: ImportKind;
  file: File;
  classNames: string[];
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
    }
  | { type: "fatal"; issue: ImportIssue };
