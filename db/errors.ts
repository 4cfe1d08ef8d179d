/**
 * Domain errors of the write modules (db/writes/*) and the queries. They say what went wrong in the
 * data's terms; `apiRoute` (lib/api.ts) is the one place that turns them into HTTP answers.
 * No server-only import: scripts and tests use them too.
 */

/** Thrown by a versioned write when the stored version moved on (409 stale_version with currentVersion). */
export class StaleVersionError extends Error {
  constructor(
    readonly what: string,
    readonly currentVersion: number,
    readonly yourVersion: number,
  ) {
    super(`${what} was changed by someone else (version ${currentVersion}, you sent ${yourVersion}).`);
  }
}

/** A row the write needs does not exist (404 not_found). `field` names the input that pointed at it. */
export class NotFoundError extends Error {
  constructor(
    readonly what: string,
    message = `${what} not found.`,
    readonly field?: string,
  ) {
    super(message);
  }
}

/** The write would break a rule of the stored data (409 conflict): the last owner, a used invite… */
export class ConflictError extends Error {
  constructor(
    message: string,
    readonly fields?: Record<string, string[]>,
  ) {
    super(message);
  }
}

/** The data changed under a CSV import (a class or the baseline removed, a name taken, too many classes): 409 conflict. */
export class ImportConflictError extends ConflictError {}

/** The input does not fit the stored data (400 invalid_input with fields): a taken name, an unknown class… */
export class InvalidInputError extends Error {
  constructor(
    message: string,
    readonly fields?: Record<string, string[]>,
  ) {
    super(message);
  }
}

/** A field error map with one message: `{ [field]: [message] }`. */
export function fieldError(field: string, message: string): Record<string, string[]> {
  return { [field]: [message] };
}

/**
 * The database cannot be opened, migrated or written right now (a read-only or missing file, a full disk…): 503
 * database_unavailable with Retry-After. db/client.ts throws it while the migrations have not yet succeeded.
 */
export class DatabaseUnavailableError extends Error {
  // by name too: the server's bundles (instrumentation, each route) may each hold their own copy of this class, and
  // db/client.ts shares one migration attempt between them through globalThis
  override readonly name = "DatabaseUnavailableError";
  constructor(
    message: string,
    override readonly cause?: unknown,
  ) {
    super(message);
  }
}
