import "server-only";
import { createHmac, randomBytes, timingSafeEqual } from "node:crypto";

// The PDF route opens the report's print view in headless Chromium, which has no session. It passes a
// short-lived token bound to one report, signed with a key that lives only in this server process
// (PLATEAU_SECRET when set, so several processes behind one address agree).
const g = globalThis as unknown as { __plateauPrintKey?: Buffer };
function key(): Buffer {
  const env = process.env.PLATEAU_SECRET;
  if (env && env.length >= 16) return Buffer.from(`print:${env}`);
  return (g.__plateauPrintKey ??= randomBytes(32));
}

const TTL_MS = 2 * 60 * 1000;

function sign(reportId: string, exp: number): string {
  return createHmac("sha256", key()).update(`${reportId}.${exp}`).digest("base64url");
}

export function printToken(reportId: string, now = Date.now()): string {
  const exp = now + TTL_MS;
  return `${exp}.${sign(reportId, exp)}`;
}

export function verifyPrintToken(reportId: string, token: string | undefined, now = Date.now()): boolean {
  if (!token) return false;
  const [expText, mac] = token.split(".");
  const exp = Number(expText);
  if (!mac || !Number.isInteger(exp) || exp < now) return false;
  const want = Buffer.from(sign(reportId, exp));
  const got = Buffer.from(mac);
  return want.length === got.length && timingSafeEqual(want, got);
}
