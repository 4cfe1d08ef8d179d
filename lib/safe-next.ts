// Where to go after signing in (`?next=` on /sign-in and /sign-up). An open redirect here sends a
// signed-in user anywhere (OWASP ASVS 4.0.3 5.1.5: redirects only to allow-listed destinations), and a
// character that is not allowed in a Location header makes the redirect itself fail with a 500. So only a
// same-origin path survives: checked as text (raw and percent-decoded), parsed as a URL against a
// placeholder origin and written back in its normalised form; anything else is the fallback.

const PLACEHOLDER = "http://plateau.invalid";
const MAX = 500;

/**
 * Printable ASCII without backslashes. Browsers strip tabs and newlines, read "\" as "/", and map some
 * non-ASCII characters onto ASCII ones ("。" → "."): each is a way to smuggle a host past a prefix check.
 */
const PRINTABLE_ASCII = /^[\x21-\x5b\x5d-\x7e]*$/;

function plainPath(s: string): boolean {
  return s.startsWith("/") && !s.startsWith("//") && PRINTABLE_ASCII.test(s);
}

/** The value once percent-decoded must be a plain path too, and not still encoded (double encoding). */
function plainWhenDecoded(s: string): boolean {
  let decoded: string;
  try {
    decoded = decodeURIComponent(s);
  } catch {
    return false; // malformed percent-encoding
  }
  return plainPath(decoded) && !/%[0-9a-f]{2}/i.test(decoded);
}

/** A same-origin path (with its query and fragment) to go to after signing in; anything else → `fallback`. */
export function safeNext(value: unknown, fallback = "/teams"): string {
  if (typeof value !== "string" || value.length === 0 || value.length > MAX) return fallback;
  if (!plainPath(value) || !plainWhenDecoded(value)) return fallback;
  let url: URL;
  try {
    url = new URL(value, PLACEHOLDER);
  } catch {
    return fallback;
  }
  if (url.origin !== PLACEHOLDER) return fallback;
  // Dot segments can collapse into a leading "//" ("/.//evil.example" → "//evil.example") or bring an
  // encoded slash to the front ("/../%2F" → "/%2F", which decodes to "//"): the result is checked again.
  const out = url.pathname + url.search + url.hash;
  return out.length <= MAX && plainPath(out) && plainWhenDecoded(out) ? out : fallback;
}
