// Runs once when the Next server starts (not during `next build`).
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
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
