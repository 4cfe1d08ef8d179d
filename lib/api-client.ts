/**
 * The browser's one way to call Plateau's JSON API (same origin): one error class, one send function, the SWR
 * fetcher and a streaming upload with progress. Every client component goes through this module.
 *
 * Error answers are always `{ "error": { "code", "message", "fields"?, … } }` (see lib/api.ts); some routes add
 * more to the error object (409 stale_version: `currentVersion`; CSV imports: `errors`, `errorCount`, `rows`).
 * `ApiRequestError.body` keeps that whole object.
 */

/** Field messages keyed by the dotted path of the input: `{ "settings.s": ["S must be greater than 0."] }`. */
export type FieldErrors = Record<string, string[]>;

/** Status of an ApiRequestError when the server could not be reached at all (no HTTP answer). */
export const NETWORK_STATUS = 0;
export const NETWORK_MESSAGE = "Could not reach the server. Check your connection and try again.";

/** A failed API call: HTTP status (0 = no answer), error code, message, field messages and the raw error object. */
export class ApiRequestError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: FieldErrors = {},
    /** The answer's `error` object as sent, extra fields included (empty when there was none). */
    readonly body: Readonly<Record<string, unknown>> = {},
    /** The whole parsed answer (undefined when it was empty or not JSON), for the few answers that are not `{ error }`. */
    readonly answer?: unknown,
  ) {
    super(message);
    this.name = "ApiRequestError";
  }

  /** True when the request never got an answer (offline, server down, connection cut). */
  get isNetworkError(): boolean {
    return this.status === NETWORK_STATUS;
  }

  /** True when the error names the input fields it is about (show them at the fields). */
  get hasFields(): boolean {
    return Object.keys(this.fields).length > 0;
  }
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

function fieldsOf(v: unknown): FieldErrors {
  if (!isRecord(v)) return {};
  const out: FieldErrors = {};
  for (const [k, msgs] of Object.entries(v)) {
    if (Array.isArray(msgs)) out[k] = msgs.map(String);
    else if (typeof msgs === "string") out[k] = [msgs];
  }
  return out;
}

/** The ApiRequestError for a non-2xx answer, from its parsed JSON body (anything else, e.g. an HTML error page, gives the generic message). */
export function errorFromAnswer(status: number, json: unknown): ApiRequestError {
  const error = isRecord(json) && isRecord(json.error) ? json.error : {};
  const message = typeof error.message === "string" && error.message ? error.message : `The request failed (${status}).`;
  const code = typeof error.code === "string" && error.code ? error.code : "error";
  return new ApiRequestError(status, code, message, fieldsOf(error.fields), error, json);
}

export function networkError(message = NETWORK_MESSAGE): ApiRequestError {
  return new ApiRequestError(NETWORK_STATUS, "network", message);
}

/** JSON of an answer body's text, or undefined when it is empty or not JSON. */
function parseJson(text: string): unknown {
  if (!text) return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}

/**
 * Send one request with an optional JSON body and return the parsed JSON answer (undefined for 204).
 * Throws ApiRequestError: status 0 with NETWORK_MESSAGE when the server cannot be reached, else the answer's
 * status, code, message and fields.
 */
export async function apiSend<T>(method: string, path: string, body?: unknown): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method,
      headers: body === undefined ? {} : { "content-type": "application/json" },
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: "same-origin",
    });
  } catch {
    throw networkError();
  }
  let text: string;
  try {
    text = await res.text();
  } catch {
    throw networkError();
  }
  const json = parseJson(text);
  if (!res.ok) throw errorFromAnswer(res.status, json);
  if (res.status === 204) return undefined as T;
  return json as T;
}

/** The SWR fetcher (also set as the default in SWRConfig): GET JSON or throw ApiRequestError. */
export const fetchJson = <T>(path: string): Promise<T> => apiSend<T>("GET", path);

/** The message to show for any error thrown by a call (ApiRequestError or not). */
export function errorMessage(err: unknown, fallback = "Something went wrong."): string {
  return err instanceof ApiRequestError ? err.message : fallback;
}

/** The version now stored when a versioned save was refused (409 stale_version), else null. */
export function staleVersionOf(err: unknown): number | null {
  if (!(err instanceof ApiRequestError) || err.code !== "stale_version") return null;
  const v = Number(err.body.currentVersion);
  return Number.isFinite(v) ? v : null;
}

export interface UploadOptions {
  /** Content type of the body, e.g. "text/csv". */
  contentType: string;
  /** Bytes sent so far and the total (the body's size when the browser does not know it). */
  onProgress?: (sent: number, total: number) => void;
  /** Aborting cancels the upload; the promise then rejects with a DOMException named "AbortError". */
  signal?: AbortSignal;
}

/**
 * POST a file (or any Blob) as the raw request body, with upload progress (fetch cannot report it, so this is
 * XMLHttpRequest). Answers are read exactly like apiSend's: JSON on success (undefined for 204), ApiRequestError
 * otherwise — its `body` carries extra error fields such as `errors` and `errorCount` of a CSV import.
 */
export function apiUpload<T>(path: string, file: Blob, opts: UploadOptions): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const { signal } = opts;
    const aborted = () => new DOMException("The upload was cancelled.", "AbortError");
    if (signal?.aborted) {
      reject(aborted());
      return;
    }
    const xhr = new XMLHttpRequest();
    const onAbortSignal = () => xhr.abort();
    const done = () => signal?.removeEventListener("abort", onAbortSignal);
    signal?.addEventListener("abort", onAbortSignal);
    xhr.upload.onprogress = (e) => opts.onProgress?.(e.loaded, e.lengthComputable ? e.total : file.size);
    xhr.onload = () => {
      done();
      const json = parseJson(xhr.responseText);
      if (xhr.status >= 200 && xhr.status < 300) resolve((xhr.status === 204 ? undefined : json) as T);
      else reject(errorFromAnswer(xhr.status, json));
    };
    xhr.onerror = () => {
      done();
      reject(networkError());
    };
    xhr.onabort = () => {
      done();
      reject(aborted());
    };
    xhr.open("POST", path);
    xhr.setRequestHeader("content-type", opts.contentType);
    xhr.send(file);
  });
}

/** True for the rejection of an upload cancelled through its AbortSignal. */
export function isAbortError(err: unknown): boolean {
  return err instanceof DOMException && err.name === "AbortError";
}
