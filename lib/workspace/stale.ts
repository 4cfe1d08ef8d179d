/** Thrown by a versioned write when the stored version moved on; routes answer 409 stale_version with it. */
export class StaleVersionError extends Error {
  constructor(
    readonly what: string,
    readonly currentVersion: number,
    readonly yourVersion: number,
  ) {
    super(`${what} was changed by someone else (version ${currentVersion}, you sent ${yourVersion}).`);
  }
}

/** 409 body: `{ error: { code: "stale_version", message, currentVersion } }`. */
export function staleResponse(e: StaleVersionError): Response {
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

/** Run a handler body and turn a StaleVersionError into the 409 answer. */
export async function withStale(fn: () => Promise<Response>): Promise<Response> {
  try {
    return await fn();
  } catch (e) {
    if (e instanceof StaleVersionError) return staleResponse(e);
    throw e;
  }
}
