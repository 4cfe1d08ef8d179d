import { inject } from "vitest";
import { openTestDb } from "./db-file";

/**
 * fetch, sent once more when a pooled keep-alive connection turns out to have been closed by the server before any
 * answer (undici "other side closed", UND_ERR_SOCKET). A synchronous read of the whole test database (db-file.ts
 * `snapshot()`, better-sqlite3) can block the test process's event loop for seconds on a busy machine; the server's
 * 5 s keep-alive timeout then ends the idle socket while the client still counts it as open. The server never read
 * that request (Node does not close a connection with a request in progress), so sending it again is safe. Streamed
 * bodies cannot be replayed and are not retried.
 */
async function fetchRetryingClosedSocket(url: string, init: RequestInit): Promise<Response> {
  try {
    return await fetch(url, init);
  } catch (e) {
    const code = (e as { cause?: { code?: string } }).cause?.code;
    if (code !== "UND_ERR_SOCKET" || init.body instanceof ReadableStream) throw e;
    return fetch(url, init);
  }
}

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
    const res = await fetchRetryingClosedSocket(this.baseUrl + path, { method, headers, body: payload, redirect: "manual" });
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

/**
 * The newest confirmation link mailed to `email`, as the local mail catcher received it (captured_mail; quoted-printable
 * soft line breaks undone). `dbPath` defaults to the shared test server's database.
 */
export function verificationTokenFor(email: string, dbPath?: string): string {
  const db = openTestDb(dbPath);
  try {
    const row = db
      .prepare(
        "select c.raw from captured_mail c join outbox o on o.id = c.outbox_id where o.kind = 'verify_email' and o.to_addresses = ? order by o.id desc limit 1",
      )
      .get(email) as { raw: string } | undefined;
    const token = row?.raw.replace(/=\r?\n/g, "").match(/\/verify-email\/([A-Za-z0-9_-]{43})\b/)?.[1];
    if (!token) throw new Error(`no confirmation link was mailed to ${email}`);
    return token;
  } finally {
    db.close();
  }
}

/** Confirm the client's address the way its owner would: the link from the captured mail, posted by the page's button. */
export async function verifyEmail(client: Client, email: string, dbPath?: string): Promise<void> {
  const r = await client.post("/api/auth/verify-email", { token: verificationTokenFor(email, dbPath) });
  if (r.status !== 200) throw new Error(`e-mail verification failed: ${r.status} ${r.text}`);
}

/**
 * Sign up a fresh user (signed in afterwards) and return the client. The address is confirmed through the mailed
 * link (as its owner would), unless `verify: false`.
 */
export async function signedUpClient(name = "Test User", opts: { verify?: boolean } = {}): Promise<{ client: Client; email: string; userId: string }> {
  const client = new Client();
  const email = uniqueEmail();
  const r = await client.post("/api/auth/sign-up", { email, password: GOOD_PASSWORD, name });
  if (r.status !== 201 && r.status !== 200) throw new Error(`sign-up failed: ${r.status} ${r.text}`);
  if (opts.verify !== false) await verifyEmail(client, email);
  return { client, email, userId: r.json.user.id };
}

/** A user with a fresh team: returns the client and the team id. */
export async function userWithTeam(teamName = "Test Team", opts: { verify?: boolean } = {}) {
  const u = await signedUpClient("Test User", opts);
  const t = await u.client.post("/api/teams", { name: teamName });
  if (t.status !== 201) throw new Error(`team create failed: ${t.status} ${t.text}`);
  return { ...u, teamId: t.json.team.id as string };
}
