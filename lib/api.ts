import "server-only";
import { type z } from "zod";
import { ready } from "@/db/client";
import { ConflictError, DatabaseUnavailableError, InvalidInputError, NotFoundError, StaleVersionError } from "@/db/errors";
import { InvalidCsvError, UploadInterruptedError } from "@/lib/import/errors";
import { ImportFatalError, type ImportIssue } from "@/lib/import/types";
import { expectedOrigin } from "@/lib/public-url";
import { securityHeaders, servedOverHttps } from "@/lib/security-headers";
import { RetryLaterError } from "@/lib/retry-later";
import { RoadmapInputError } from "@/lib/scaling";

/** Error body of every API answer: `{ error: { code, message, fields? } }`. */
export type ApiErrorBody = { error: { code: string; message: string; fields?: Record<string, string[]> } };

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string[]>,
    /** Extra response headers, e.g. Retry-After on a 429. */
    readonly headers?: Record<string, string>,
  ) {
    super(message);
  }
}

export const unauthorized = () => new ApiError(401, "unauthorized", "Sign in first.");
export const forbidden = (message = "Your role in this team does not allow this.") => new ApiError(403, "forbidden", message);
export const notFound = (what = "Resource") => new ApiError(404, "not_found", `${what} not found.`);
export const conflict = (message: string, fields?: Record<string, string[]>) => new ApiError(409, "conflict", message, fields);
export const badRequest = (message: string, fields?: Record<string, string[]>) => new ApiError(400, "invalid_input", message, fields);
/** 429 with Retry-After (whole seconds, at least 1). */
export const tooManyRequests = (code: string, message: string, retryAfterSeconds: number) =>
  new ApiError(429, code, message, undefined, { "retry-after": String(Math.max(1, Math.ceil(retryAfterSeconds))) });

export function errorResponse(e: ApiError): Response {
  const body: ApiErrorBody = { error: { code: e.code, message: e.message, ...(e.fields ? { fields: e.fields } : {}) } };
  return Response.json(body, { status: e.status, ...(e.headers ? { headers: e.headers } : {}) });
}

/** zod issues → `{ "a.b": ["message"] }`, keyed by the dotted path ("" for the root). */
export function zodFields(err: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of err.issues) {
    const key = issue.path.map(String).join(".");
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

export function parseOrThrow<T extends z.ZodType>(schema: T, value: unknown, message = "Some fields are not valid."): z.infer<T> {
  const r = schema.safeParse(value);
  if (!r.success) throw badRequest(message, zodFields(r.error));
  return r.data;
}

/** 409 body of a versioned write that lost the race: `{ error: { code: "stale_version", message, currentVersion } }`. */
function staleResponse(e: StaleVersionError): Response {
  return Response.json(
    {
      error: {
        code: "stale_version",
        message: `${e.what} was saved by someone else since you loaded it (now version ${e.currentVersion}, yours ${e.yourVersion}). Reload theirs or save yours as a copy.`,
        currentVersion: e.currentVersion,
      },
    },
    { status: 409 },
  );
}

/** 400 (or the fatal error's status) listing the problems of a CSV: `{ error: { code, message, errors, errorCount, rows? } }`. */
function invalidCsvResponse(p: { errors: ImportIssue[]; errorCount: number; rows?: number; status: number; code: string; message: string }): Response {
  return Response.json(
    {
      error: {
        code: p.code,
        message: p.message,
        errors: p.errors,
        errorCount: p.errorCount,
        ...(p.rows !== undefined ? { rows: p.rows } : {}),
      },
    },
    { status: p.status },
  );
}

/**
 * THE mapping of errors to answers: ApiError as it says; the domain errors of db/errors.ts (writes and
 * queries) and the CSV import's errors to their status and code. Undefined for anything else (a 500).
 */
export function knownErrorResponse(e: unknown): Response | undefined {
  if (e instanceof ApiError) return errorResponse(e);
  if (e instanceof StaleVersionError) return staleResponse(e);
  if (e instanceof NotFoundError) return errorResponse(new ApiError(404, "not_found", e.message, e.field ? { [e.field]: [e.message] } : undefined));
  if (e instanceof ConflictError) return errorResponse(conflict(e.message, e.fields));
  if (e instanceof InvalidInputError) return errorResponse(badRequest(e.message, e.fields));
  // the roadmap engine's bad steps (lib/scaling/roadmap.ts): the path names the step and field, "steps.1.settings.overrides.M9"
  if (e instanceof RoadmapInputError) return errorResponse(badRequest(e.message, { [e.path.map(String).join(".")]: [e.message] }));
  if (e instanceof InvalidCsvError) return invalidCsvResponse(e);
  if (e instanceof ImportFatalError) {
    const csv = new InvalidCsvError([e.issue], 1, undefined, e.status, e.code);
    return invalidCsvResponse(csv);
  }
  if (e instanceof UploadInterruptedError) return errorResponse(new ApiError(400, "upload_incomplete", e.message));
  if (e instanceof RetryLaterError) return errorResponse(new ApiError(e.status, e.code, e.message, undefined, { "retry-after": String(e.retryAfterS) }));
  const db = databaseUnavailable(e);
  if (db) return errorResponse(db);
  // the client went away (request.signal): nobody reads this answer, and it is not a fault to log
  if (e instanceof DOMException && e.name === "AbortError") return errorResponse(new ApiError(499, "client_closed_request", "The request was cancelled."));
  return undefined;
}

/** SQLite result codes that mean "the database cannot be used right now", not "this request is wrong". */
const UNAVAILABLE = /^SQLITE_(READONLY|BUSY|LOCKED|CANTOPEN|IOERR|FULL|PERM|NOMEM|PROTOCOL|NOLFS)(_|$)/;
/** Seconds a client should wait before retrying a request that hit an unavailable database. */
export const DATABASE_RETRY_AFTER_S = 5;

/**
 * A database failure as a 503 with Retry-After (the JSON body as every error; never the driver's text): the file
 * cannot be written (SQLITE_READONLY, SQLITE_PERM, SQLITE_CANTOPEN), is locked past the busy timeout (SQLITE_BUSY,
 * SQLITE_LOCKED), or the disk fails or is full (SQLITE_IOERR_*, SQLITE_FULL). Undefined for anything else. The
 * driver's error (better-sqlite3's SqliteError, through Knex) carries the code; the migration gate of db/client.ts
 * throws DatabaseUnavailableError.
 */
export function databaseUnavailable(e: unknown): ApiError | undefined {
  if (e instanceof DatabaseUnavailableError || (e instanceof Error && e.name === "DatabaseUnavailableError")) return unavailable(e.message);
  const code = typeof e === "object" && e !== null && "code" in e ? (e as { code: unknown }).code : undefined;
  if (typeof code === "string" && UNAVAILABLE.test(code)) {
    console.error(`[api] database unavailable: ${code}`);
    return unavailable(
      /READONLY|PERM|CANTOPEN/.test(code)
        ? "The database cannot be written right now; nothing was stored. Try again shortly."
        : /BUSY|LOCKED/.test(code)
          ? "The database is busy; nothing was stored. Try again shortly."
          : "The database is not available right now; nothing was stored. Try again shortly.",
    );
  }
  return undefined;
}

const unavailable = (message: string) => new ApiError(503, "database_unavailable", message, undefined, { "retry-after": String(DATABASE_RETRY_AFTER_S) });

const STATE_CHANGING = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/**
 * State-changing requests must come from our own origin: scheme, host and port equal to PLATEAU_PUBLIC_URL's, or
 * without it to the request's own (lib/public-url.ts `expectedOrigin`; never a client-chosen X-Forwarded-Host).
 * A request without an Origin header (a script with curl) is accepted: browsers always send Origin on
 * cross-site POST/PUT/PATCH/DELETE (OWASP ASVS 4.0.3 4.2.2, 13.2.3).
 */
export function checkOrigin(req: Request): void {
  if (!STATE_CHANGING.has(req.method)) return;
  const origin = req.headers.get("origin");
  if (!origin) return;
  let actual: string;
  try {
    actual = new URL(origin).origin;
  } catch {
    throw new ApiError(403, "bad_origin", "The request's Origin header is not valid.");
  }
  const expected = expectedOrigin(req.headers);
  if (!expected || actual !== expected) throw new ApiError(403, "bad_origin", "Cross-site requests are not accepted.");
}

export const DEFAULT_JSON_LIMIT = 256 * 1024;

/** Read a JSON body: 415 on a wrong content type, 413 above `maxBytes`, 400 on bad JSON or a schema failure. */
export async function readJson<T extends z.ZodType>(req: Request, schema: T, maxBytes = DEFAULT_JSON_LIMIT): Promise<z.infer<T>> {
  const type = req.headers.get("content-type") ?? "";
  if (!/^application\/json\b/i.test(type)) {
    throw new ApiError(415, "unsupported_media_type", "Send the body as application/json.");
  }
  const declared = Number(req.headers.get("content-length") ?? "NaN");
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge(maxBytes);
  const text = await readTextLimited(req, maxBytes);
  let value: unknown;
  try {
    value = text === "" ? undefined : JSON.parse(text);
  } catch {
    throw badRequest("The body is not valid JSON.");
  }
  return parseOrThrow(schema, value);
}

export function tooLarge(maxBytes: number): ApiError {
  return new ApiError(413, "payload_too_large", `The body is larger than the limit of ${Math.round(maxBytes / 1024)} KiB.`);
}

async function readTextLimited(req: Request, maxBytes: number): Promise<string> {
  if (!req.body) return "";
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > maxBytes) {
      await reader.cancel();
      throw tooLarge(maxBytes);
    }
    chunks.push(value);
  }
  return new TextDecoder().decode(Buffer.concat(chunks));
}

type Ctx<P> = { params: Promise<P> };

/**
 * Wrap a route handler: origin check, then the handler; ApiError and the domain errors → their status
 * and body (knownErrorResponse), anything else → 500 with a generic message (the cause is logged, never returned).
 */
export function apiRoute<P = Record<string, string>>(fn: (req: Request, params: P) => Promise<Response>) {
  return async (req: Request, ctx: Ctx<P>): Promise<Response> => {
    try {
      checkOrigin(req);
      await ready(); // the migrations: 503 database_unavailable while they cannot run (retried on each request)
      const params = ctx?.params ? await ctx.params : ({} as P);
      return withTransportSecurity(await fn(req, params));
    } catch (e) {
      const known = knownErrorResponse(e);
      if (known) return withTransportSecurity(known);
      console.error(`[api] ${req.method} ${new URL(req.url).pathname} failed`, e);
      return withTransportSecurity(errorResponse(new ApiError(500, "internal", "Something went wrong on our side. The error was logged.")));
    }
  };
}

/**
 * Strict-Transport-Security on an API answer in production over HTTPS (the other API headers are static, from
 * next.config.ts; HSTS depends on PLATEAU_PUBLIC_URL at run time).
 */
export function withTransportSecurity(res: Response): Response {
  if (!servedOverHttps(process.env)) return res;
  const hsts = securityHeaders({ kind: "api", dev: false, https: true })["strict-transport-security"]!;
  try {
    res.headers.set("strict-transport-security", hsts);
    return res;
  } catch {
    // An answer with immutable headers: copy it.
    const copy = new Response(res.body, res);
    copy.headers.set("strict-transport-security", hsts);
    return copy;
  }
}
