// Runs once when the Next server starts (not during `next build`).
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { ready } = await import("@/db/client");
  await ready();
  const { startMailIfNeeded } = await import("@/lib/mail/start");
  await startMailIfNeeded();
}
