import type { ImportIssue } from "./types";

/**
 * What a CSV import reports instead of storing: thrown by lib/import/run-*.ts and the upload reader,
 * answered by `apiRoute` (lib/api.ts) — together with ImportFatalError (./types) — as
 * `{ error: { code, message, errors, errorCount, rows? } }`.
 */
export class InvalidCsvError extends Error {
  constructor(
    readonly errors: ImportIssue[],
    readonly errorCount: number,
    readonly rows?: number,
    readonly status = 400,
    readonly code = "invalid_csv",
  ) {
    super(invalidCsvMessage(errors, errorCount));
  }
}

/** "The file has 3 errors. Nothing was stored." (or the one file-level problem itself). */
export function invalidCsvMessage(errors: ImportIssue[], errorCount: number): string {
  const n = errorCount;
  return n === 1 && errors[0]?.line === null
    ? `${errors[0]!.message} Nothing was stored.`
    : `The file has ${n.toLocaleString("en-US")} error${n === 1 ? "" : "s"}${n > errors.length ? ` (the first ${errors.length} are listed)` : ""}. Nothing was stored.`;
}

/** The client stopped sending before the body was complete (400 upload_incomplete); nothing was stored. */
export class UploadInterruptedError extends Error {
  constructor(cause?: unknown) {
    super("The upload was interrupted; nothing was stored.", { cause });
  }
}
