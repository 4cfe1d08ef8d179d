import { describe, expect, it } from "vitest";
import { COMMON_PASSWORDS_TEXT } from "@/lib/common-passwords";
import { COMMON_PASSWORD, hashPassword, isCommonPassword, passwordProblem, verifyPassword } from "@/lib/password";
import { signUpSchema } from "@/lib/validation/auth";

describe("hashPassword / verifyPassword", () => {
  it("hashPassword(p) uses scrypt N=2^15 r=8 p=1 with a 16-byte salt and verifies only p", async () => {
    const h = await hashPassword("granite river 2031");
    const [alg, n, r, p, salt, key] = h.split("$");
    expect([alg, n, r, p]).toEqual(["scrypt", "32768", "8", "1"]);
    expect(Buffer.from(salt!, "base64")).toHaveLength(16);
    expect(Buffer.from(key!, "base64")).toHaveLength(32);
    expect(await verifyPassword("granite river 2031", h)).toBe(true);
    expect(await verifyPassword("granite river 2032", h)).toBe(false);
    expect(await verifyPassword("Granite river 2031", h)).toBe(false);
  });

  it("hashPassword(p) salts: the same password hashes differently each time", async () => {
    const [a, b] = await Promise.all([hashPassword("same password 1"), hashPassword("same password 1")]);
    expect(a).not.toBe(b);
    expect(await verifyPassword("same password 1", b)).toBe(true);
  });

  it("verifyPassword never matches a malformed or foreign hash", async () => {
    for (const bad of ["", "plain", "bcrypt$2b$10$abc", "scrypt$x$8$1$AAAA$AAAA", "scrypt$32768$8$1$$", "scrypt$1073741824$8$1$AAAA$AAAA"]) {
      expect(await verifyPassword("anything at all", bad)).toBe(false);
    }
  });

  it("verifyPassword refuses passwords over 128 characters without hashing them", async () => {
    const h = await hashPassword("a".repeat(60) + "b".repeat(68));
    expect(await verifyPassword("a".repeat(60) + "b".repeat(68), h)).toBe(true);
    expect(await verifyPassword("a".repeat(60) + "b".repeat(69), h)).toBe(false);
    await expect(hashPassword("x".repeat(129))).rejects.toThrow(RangeError);
  });

  it("normalises Unicode (NFKC) so composed and decomposed forms match", async () => {
    const h = await hashPassword("caf\u00e9 au lait 99");
    expect(await verifyPassword("cafe\u0301 au lait 99", h)).toBe(true);
  });
});

describe("passwordProblem", () => {
  it.each([
    ["short", "123456789", /at least 10/],
    ["long", "ab".repeat(64) + "c", /at most 128/],
    ["one repeated character", "zzzzzzzzzzzz", /more than one distinct/],
  ])("refuses a %s password", (_what, pw, msg) => {
    expect(passwordProblem(pw)).toMatch(msg);
  });

  it("refuses the e-mail address itself (any case) and accepts a reasonable password", () => {
    expect(passwordProblem("Ann@Example.com", "ann@example.com")).toMatch(/e-mail/);
    expect(passwordProblem("copper wires 7", "ann@example.com")).toBeNull();
    expect(passwordProblem("granite river 2031")).toBeNull();
  });

  // OWASP ASVS 4.0.3 2.1.7: passwords are checked against a set of breached/common passwords. The list is zxcvbn's
  // top-30,000 (Burnett's 10M corpus) via Debian python3-zxcvbn, entries of 10+ characters (lib/common-passwords.ts).
  it.each(["1234567890", "qwertyuiop", "Password123", " 1q2w3e4r5t ", "QWERTY123456", "manchester"])("refuses the common password %j", (pw) => {
    expect(passwordProblem(pw)).toBe(COMMON_PASSWORD);
    expect(isCommonPassword(pw)).toBe(true);
  });

  it("accepts passwords that are not on the list, and the list has the size its source says", () => {
    expect(isCommonPassword("copper wires 7")).toBe(false);
    expect(isCommonPassword("1234567890x")).toBe(false);
    expect(COMMON_PASSWORDS_TEXT.split("\n")).toHaveLength(1090);
    expect(COMMON_PASSWORDS_TEXT.split("\n").every((p) => p.length >= 10 && p === p.toLowerCase())).toBe(true);
  });
});

describe("signUpSchema", () => {
  it("lower-cases and trims the e-mail and reports every bad field at once", () => {
    const ok = signUpSchema.safeParse({ email: "  Ann@Example.COM ", password: "copper wires 7", name: " Ann " });
    expect(ok.success && ok.data).toEqual({ email: "ann@example.com", password: "copper wires 7", name: "Ann" });
    const bad = signUpSchema.safeParse({ email: "nope", password: "short", name: "" });
    expect(bad.success).toBe(false);
    const paths = bad.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["email", "password", "name"]));
  });
});
