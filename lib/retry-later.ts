/**
 * "Not now, try again in `retryAfterS` seconds": a full queue or a per-user limit (429) or a resource that is
 * unavailable for a while, such as a database that cannot be written (503). `apiRoute` (lib/api.ts) answers it with
 * the JSON error body and a `Retry-After` header. No server-only import: scripts and tests use it too.
 */
export class RetryLaterError extends Error {
  constructor(
    readonly status: 429 | 503,
    readonly code: string,
    message: string,
    readonly retryAfterS: number,
  ) {
    super(message);
  }
}
