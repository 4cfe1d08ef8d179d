import type { FormatIssue } from "@/lib/scaling";

/** One problem found in an uploaded CSV (the formats' issue). `line` is the 1-based physical line (1 = header); null for file-level problems. */
export type ImportIssue = FormatIssue;

export type ImportMode = "replace" | "merge";

/** Raised for problems that stop reading the file at once (binary, not UTF-8, too large, empty, bad header). */
export class ImportFatalError extends Error {
  constructor(
    readonly issue: ImportIssue,
    readonly status: number = 400,
    readonly code: string = "invalid_csv",
  ) {
    super(issue.message);
  }
}

/** Collects row problems: keeps the first `cap` and counts all. */
export class IssueList {
  readonly items: ImportIssue[] = [];
  total = 0;
  constructor(readonly cap: number) {}
  add(issue: ImportIssue): void {
    this.total += 1;
    if (this.items.length < this.cap) this.items.push(issue);
  }
  /** Adds an issue at the head of the list (a file-level issue that must not be cut by the cap). */
  addFirst(issue: ImportIssue): void {
    this.total += 1;
    this.items.unshift(issue);
    if (this.items.length > this.cap) this.items.pop();
  }
  get ok(): boolean {
    return this.total === 0;
  }
}

/** One CSV import into an existing baseline, as its route hands it to lib/import (run-classes.ts, run-histograms.ts). */
export type BaselineImportRequest = {
  baselineId: string;
  teamId: string;
  userId: string;
  mode: ImportMode;
  dryRun: boolean;
  /** The baseline version the client loaded (required unless dryRun): a newer stored version → 409 stale_version. */
  version?: number;
  source: AsyncIterable<Uint8Array>;
  maxBytes?: number;
};
