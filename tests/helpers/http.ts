import { inject } from "vitest";

/**
 * A tiny HTTP client for route tests: keeps the session cookie (`cookie`) and the known-device cookie (`device`,
 * lib/known-device.ts), sends a same-origin Origin on writes.
 */
export class Client {
  cookie = "";
  device = "";
  constructor(readonly baseUrl: string = inject("baseUrl")) {}

  async req(method: string, path: string, body?: unknown, init: { headers?: Record<string, string>; raw?: BodyInit } = {}) {
    const headers: Record<string, string> = { ...(init.headers ?? {}) };
    const jar = [this.cookie, this.device].filter(Boolean).join("; ");
    if (jar && !("cookie" in headers)) headers.cookie = jar;
    if (method !== "GET" && method !== "HEAD" && !("origin" in headers)) headers.origin = this.baseUrl;
    let payload: BodyInit | undefined = init.raw;
    if (body !== undefined) {
      headers["content-type"] ??= "application/json";
      payload = JSON.stringify(body);
    }
    const res = await fetch(this.baseUrl + path, { method, headers, body: payload, redirect: "manual" });
    const set = res.headers.getSetCookie();
    for (const c of set) {
      const [pair] = c.split(";");
      if (pair?.startsWith("plateau_session=")) this.cookie = pair.endsWith("=") ? "" : pair;
      if (pair?.startsWith("plateau_device=")) this.device = pair.endsWith("=") ? "" : pair;
    }
    const text = await res.text();
    let json: any = undefined;
    try {
      json = text ? JSON.parse(text) : undefined;
    } catch {
      /* not JSON */
    }
    return { status: res.status, json, text, headers: res.headers };
  }

  get(path: string) {
    return this.req("GET", path);
  }
  post(path: string, body?: unknown) {
    return this.req("POST", path, body ?? {});
  }
  patch(path: string, body?: unknown) {
    return this.req("PATCH", path, body ?? {});
  }
  put(path: string, body?: unknown) {
    return this.req("PUT", path, body ?? {});
  }
  del(path: string) {
    return this.req("DELETE", path);
  }
}

let counter = 0;
/** A unique e-mail per call, so tests sharing one server never collide. */
export function uniqueEmail(prefix = "user"): string {
  counter += 1;
  return `${prefix}-${Date.now().toString(36)}-${process.pid}-${counter}@example.test`;
}

export const GOOD_PASSWORD = "correct horse battery staple 42";

/** Sign up a fresh user (signed in afterwards) and return the client. */
export async function signedUpClient(name = "Test User"): Promise<{ client: Client; email: string; userId: string }> {
  const client = new Client();
  const email = uniqueEmail();
  const r = await client.post("/api/auth/sign-up", { email, password: GOOD_PASSWORD, name });
  if (r.status !== 201 && r.status !== 200) throw new Error(`sign-up failed: ${r.status} ${r.text}`);
  return { client, email, userId: r.json.user.id };
}

/** A user with a fresh team: returns the client and the team id. */
export async function userWithTeam(teamName = "Test Team") {
  const u = await signedUpClient();
  const t = await u.client.post("/api/teams", { name: teamName });
  if (t.status !== 201) throw new Error(`team create failed: ${t.status} ${t.text}`);
  return { ...u, teamId: t.json.team.id as string };
}
