/** Browser-side helpers for calling Plateau's JSON API (same origin). */
export type ApiFailure = { status: number; message: string; fields: Record<string, string[]> };

export class ApiRequestError extends Error {
  constructor(readonly failure: ApiFailure) {
    super(failure.message);
  }
}

export async function apiSend<T>(method: string, path: string, body?: unknown): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method,
      headers: body === undefined ? {} : { "content-type": "application/json" },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiRequestError({ status: 0, message: "Could not reach the server. Check your connection and try again.", fields: {} });
  }
  const json = (await res.json().catch(() => undefined)) as { error?: { message?: string; fields?: Record<string, string[]> } } | undefined;
  if (!res.ok) {
    throw new ApiRequestError({ status: res.status, message: json?.error?.message ?? `The request failed (${res.status}).`, fields: json?.error?.fields ?? {} });
  }
  return json as T;
}

/** SWR fetcher: GET JSON or throw ApiRequestError. */
export const fetchJson = <T,>(path: string): Promise<T> => apiSend<T>("GET", path);
