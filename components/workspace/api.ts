"use client";

/** An API error answer: status, code, message and field messages (`{ "settings.s": ["S must be greater than 0."] }`). */
export class ApiFailure extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string[]> = {},
    readonly body: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

export async function api<T>(method: string, url: string, body?: unknown): Promise<T> {
  const res = await fetch(url, {
    method,
    headers: body === undefined ? {} : { "content-type": "application/json" },
    body: body === undefined ? undefined : JSON.stringify(body),
    credentials: "same-origin",
  });
  if (res.status === 204) return undefined as T;
  const json = await res.json().catch(() => ({}));
  if (!res.ok) {
    const e = json?.error ?? {};
    throw new ApiFailure(res.status, e.code ?? "error", e.message ?? `Request failed (${res.status}).`, e.fields ?? {}, e);
  }
  return json as T;
}

export const fetcher = <T,>(url: string) => api<T>("GET", url);
