import { randomBytes } from "node:crypto";

const ALPHABET = "abcdefghijklmnopqrstuvwxyz234567";

/** A random row id: 20 base32 characters (100 bits), URL-safe and lower case. */
export function newId(): string {
  const bytes = randomBytes(20);
  let out = "";
  for (const b of bytes) out += ALPHABET[b & 31];
  return out;
}
