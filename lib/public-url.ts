import "server-only";
import { PEER_PROTO_HEADER, proxyTrust } from "@/lib/client-address";

/**
 * THE base URL of every link that leaves the app (invites, share links, report e-mails, password resets) and
 * the origin that state-changing requests must come from. Never the request's Host or X-Forwarded-Host,
 * which a client chooses (issue 12 finding 7: an invite could carry https://evil.example/invite/<token>).
 *
 * - `PLATEAU_PUBLIC_URL` (e.g. `https://plateau.example.com`) when set and valid;
 * - otherwise the address the server listens on, as `next start` / `next dev` announce it
 *   (`http://localhost:3000`, or the `-H` host: Next stores it in `__NEXT_PRIVATE_ORIGIN` when it starts
 *   listening), falling back to `http://localhost:$PORT`. A production start without `PLATEAU_PUBLIC_URL`
 *   logs a warning (instrumentation.ts): such links only work on the server's own machine.
 */

function configuredPublicUrl(): URL | null {
  const raw = process.env.PLATEAU_PUBLIC_URL?.trim();
  if (!raw) return null;
  try {
    const u = new URL(raw);
    if ((u.protocol !== "http:" && u.protocol !== "https:") || u.username || u.password || u.search || u.hash) return null;
    return u;
  } catch {
    return null;
  }
}

function listenOrigin(): string {
  const announced = process.env.__NEXT_PRIVATE_ORIGIN?.trim();
  if (announced) {
    try {
      return new URL(announced).origin;
    } catch {
      /* fall through */
    }
  }
  return `http://localhost:${process.env.PORT || "3000"}`;
}

/** The base URL for links, without a trailing slash. */
export function publicBaseUrl(): string {
  const u = configuredPublicUrl();
  if (!u) return listenOrigin();
  return (u.origin + u.pathname).replace(/\/+$/, "");
}

/** What to warn about at start-up, or null. */
export function publicUrlWarning(env: NodeJS.ProcessEnv = process.env): string | null {
  const raw = env.PLATEAU_PUBLIC_URL?.trim();
  if (raw && !configuredPublicUrl()) {
    return `PLATEAU_PUBLIC_URL ("${raw}") is not an http(s) URL without credentials, query or fragment; it is ignored. Links in e-mails use the listen address instead.`;
  }
  if (!raw && env.NODE_ENV === "production") {
    return "PLATEAU_PUBLIC_URL is not set: links in e-mails (invites, share links, password resets) use the listen address (e.g. http://localhost:3000) and work only on this machine, and state-changing requests must come from the address the browser used. Set it to the address users reach, e.g. https://plateau.example.com.";
  }
  return null;
}

/**
 * The origin a browser's same-site request carries: PLATEAU_PUBLIC_URL's when set; otherwise the scheme of the
 * connection (or of the trusted proxy's X-Forwarded-Proto) with the Host header (or, behind a trusted proxy,
 * its X-Forwarded-Host). Null when the request says nothing usable.
 */
export function expectedOrigin(headers: Headers): string | null {
  const u = configuredPublicUrl();
  if (u) return u.origin;
  const behindProxy = proxyTrust().kind !== "none";
  const first = (name: string) => headers.get(name)?.split(",")[0]?.trim() || null;
  const host = (behindProxy ? first("x-forwarded-host") : null) ?? headers.get("host");
  const forwardedProto = behindProxy ? first("x-forwarded-proto") : null;
  const proto = forwardedProto === "https" || forwardedProto === "http" ? forwardedProto : headers.get(PEER_PROTO_HEADER) === "https" ? "https" : "http";
  if (!host) return null;
  try {
    return new URL(`${proto}://${host}`).origin;
  } catch {
    return null;
  }
}
