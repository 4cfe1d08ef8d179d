import "server-only";

/**
 * Base URL for links that leave the app (invites, share links): `PLATEAU_PUBLIC_URL` when set, otherwise the
 * host the request came in on (the forwarded host behind a proxy), so a link made while browsing
 * http://127.0.0.1:4100 reads http://127.0.0.1:4100, not the server's own idea of its name.
 */
export function publicBaseUrl(req: Request): string {
  const env = process.env.PLATEAU_PUBLIC_URL?.trim();
  if (env) return env.replace(/\/+$/, "");
  const url = new URL(req.url);
  const host = req.headers.get("x-forwarded-host") ?? req.headers.get("host") ?? url.host;
  const proto = req.headers.get("x-forwarded-proto") ?? url.protocol.replace(":", "");
  return `${proto}://${host}`;
}
