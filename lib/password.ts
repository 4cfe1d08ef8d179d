import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from "node:crypto";
import { COMMON_PASSWORDS_TEXT } from "@/lib/common-passwords";

// scrypt with N = 2^15, r = 8, p = 1 needs 32 MiB; Node's default maxmem (32 MiB) is just too small.
const PARAMS = { N: 2 ** 15, r: 8, p: 1 } as const;
const MAXMEM = 64 * 1024 * 1024;
const KEY_LEN = 32;
const SALT_LEN = 16;

export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 128;

function scryptAsync(password: string, salt: Buffer, keyLen: number, opts: ScryptOptions): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    scrypt(password.normalize("NFKC"), salt, keyLen, opts, (err, key) => (err ? reject(err) : resolve(key)));
  });
}

/** Hash a password: `scrypt$N$r$p$<salt b64>$<key b64>` with a fresh 16-byte salt. */
export async function hashPassword(password: string): Promise<string> {
  if (password.length > PASSWORD_MAX) throw new RangeError(`password longer than ${PASSWORD_MAX} characters`);
  const salt = randomBytes(SALT_LEN);
  const key = await scryptAsync(password, salt, KEY_LEN, { ...PARAMS, maxmem: MAXMEM });
  return ["scrypt", PARAMS.N, PARAMS.r, PARAMS.p, salt.toString("base64"), key.toString("base64")].join("$");
}

/** Compare a password with a stored hash in constant time. Malformed hashes never match. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  if (password.length > PASSWORD_MAX) return false;
  const parts = stored.split("$");
  if (parts.length !== 6 || parts[0] !== "scrypt") return false;
  const [, n, r, p, saltB64, keyB64] = parts as [string, string, string, string, string, string];
  const N = Number(n);
  const R = Number(r);
  const P = Number(p);
  if (!Number.isInteger(N) || !Number.isInteger(R) || !Number.isInteger(P) || N < 2 || N > 2 ** 20 || R < 1 || R > 32 || P < 1 || P > 16) return false;
  const salt = Buffer.from(saltB64, "base64");
  const expected = Buffer.from(keyB64, "base64");
  if (salt.length === 0 || expected.length === 0) return false;
  const actual = await scryptAsync(password, salt, expected.length, { N, r: R, p: P, maxmem: Math.max(MAXMEM, 256 * N * R) });
  return actual.length === expected.length && timingSafeEqual(actual, expected);
}

// Hash of a random password: verifying against it costs the same as a real account (unknown e-mails).
let dummy: Promise<string> | undefined;
export function dummyHash(): Promise<string> {
  return (dummy ??= hashPassword(randomBytes(18).toString("base64")));
}

let common: Set<string> | undefined;
/** Whether a password is on the bundled list of common passwords (lib/common-passwords.ts), ignoring case and outer spaces. */
export function isCommonPassword(password: string): boolean {
  common ??= new Set(COMMON_PASSWORDS_TEXT.split("\n"));
  return common.has(password.normalize("NFKC").trim().toLowerCase());
}

export const COMMON_PASSWORD = "This is one of the most common passwords. Choose another: a few unrelated words work well.";

/** Why a password is refused, or null when it is acceptable (OWASP ASVS 4.0.3 2.1.1, 2.1.7). */
export function passwordProblem(password: string, email?: string): string | null {
  if (password.length < PASSWORD_MIN) return `Use at least ${PASSWORD_MIN} characters.`;
  if (password.length > PASSWORD_MAX) return `Use at most ${PASSWORD_MAX} characters.`;
  if (new Set(password).size === 1) return "Use more than one distinct character.";
  if (isCommonPassword(password)) return COMMON_PASSWORD;
  if (email && password.trim().toLowerCase() === email.trim().toLowerCase()) return "The password must not be your e-mail address.";
  return null;
}
