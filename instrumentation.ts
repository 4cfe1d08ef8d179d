// Runs once when the Next server starts (not during `next build`).
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  // Before any request: record each request's socket address (lib/client-address.ts explains why).
  const http = await import("node:http");
  const https = await import("node:https");
  const { installPeerStamp, parseTrustedProxies } = await import("@/lib/client-address");
  installPeerStamp([http.Server, https.Server]);
  try {
    parseTrustedProxies(process.env.PLATEAU_TRUSTED_PROXIES);
  } catch (e) {
    console.error(`[plateau] ${(e as Error).message} No proxy is trusted: the socket address is the client.`);
  }
  const { publicUrlWarning } = await import("@/lib/public-url");
  const warning = publicUrlWarning();
  if (warning) console.warn(`[plateau] ${warning}`);
  const { ready } = await import("@/db/client");
  try {
    await ready();
  } catch {
    // A database that cannot be migrated now (read-only, locked…) must not stop the server: every API request
    // retries (db/client.ts ready) and answers 503 until it succeeds; /api/health says why.
    return;
  }
  const { startMailIfNeeded } = await import("@/lib/mail/start");
  await startMailIfNeeded();
}
