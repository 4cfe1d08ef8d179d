import "server-only";
import { ApiError } from "@/lib/api";
import { ImportConflictError } from "@/db/queries/import";
import { ImportFatalError, type ImportIssue } from "./types";

/** 400 answer listing the problems of a CSV (nothing stored). */
export function invalidCsvResponse(p: { errors: ImportIssue[]; errorCount: number; rows?: number; status?: number; code?: string }): Response {
  const n = p.errorCount;
  const message =
    n === 1 && p.errors[0]?.line === null
      ? `${p.errors[0]!.message} Nothing was stored.`
      : `The file has ${n.toLocaleString("en-US")} error${n === 1 ? "" : "s"}${n > p.errors.length ? ` (the first ${p.errors.length} are listed)` : ""}. Nothing was stored.`;
  return Response.json(
    { error: { code: p.code ?? "invalid_csv", message, errors: p.errors, errorCount: n, ...(p.rows !== undefined ? { rows: p.rows } : {}) } },
    { status: p.status ?? 400 },
  );
}

/** Map what a streamed import can throw to an answer; rethrow what is not ours (→ 500). */
export function importErrorResponse(e: unknown): Response {
  if (e instanceof ImportFatalError) return invalidCsvResponse({ errors: [e.issue], errorCount: 1, status: e.status, code: e.code });
  if (e instanceof ImportConflictError) return Response.json({ error: { code: "conflict", message: e.message } }, { status: 409 });
  if (e instanceof ApiError) throw e;
  if (e instanceof Error && /aborted|terminated|ECONNRESET|premature/i.test(`${e.name} ${e.message} ${(e as { code?: string }).code ?? ""}`)) {
    return Response.json({ error: { code: "upload_incomplete", message: "The upload was interrupted; nothing was stored." } }, { status: 400 });
  }
  throw e;
}
