/** A same-site path to go to after signing in; anything else (absolute or protocol-relative URLs) → /teams. */
export function safeNext(value: unknown, fallback = "/teams"): string {
  if (typeof value !== "string") return fallback;
  if (!value.startsWith("/") || value.startsWith("//") || value.startsWith("/\\") || value.length > 500) return fallback;
  return value;
}
