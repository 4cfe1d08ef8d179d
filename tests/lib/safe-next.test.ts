import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { safeNext } from "@/lib/safe-next";

// OWASP ASVS 4.0.3 5.1.5: redirects go only to allow-listed destinations (here: same-origin paths).

describe("safeNext", () => {
  it("keeps same-origin paths with their query and fragment", () => {
    expect(safeNext("/teams")).toBe("/teams");
    expect(safeNext("/teams/abc/scenarios/x1?tab=sweep#top")).toBe("/teams/abc/scenarios/x1?tab=sweep#top");
    expect(safeNext("/invite/AbC-_123")).toBe("/invite/AbC-_123");
    expect(safeNext("/teams/./a/../b")).toBe("/teams/b");
  });

  // The values as Next hands them to the page (query already percent-decoded once).
  const refused: [string, unknown][] = [
    ["not a string", ["/teams"]],
    ["empty", ""],
    ["absolute URL", "https://evil.example/"],
    ["scheme without slashes", "javascript:alert(1)"],
    ["protocol-relative", "//evil.example"],
    ["backslash", "/\\evil.example"],
    ["tab after the slash (issue 12 finding 3)", "/\t/evil.example"],
    ["newline (issue 12: a 500 before)", "/\n/x"],
    ["carriage return", "/x\r\nSet-Cookie: a=b"],
    ["ideographic full stop (issue 12: a 500 before)", "/\u3002/x"],
    ["fullwidth solidus", "/\uff0f/evil.example"],
    ["encoded slash making //", "/%2Fevil.example"],
    ["encoded backslash", "/%5Cevil.example"],
    ["encoded tab", "/%09/evil.example"],
    ["double-encoded slash", "/%252F/evil.example"],
    ["malformed percent-encoding", "/%E0%A4%A"],
    ["dot segment collapsing into //", "/.//evil.example"],
    ["dot segment bringing an encoded slash to the front (fast-check seed 872086821)", "/../%2F"],
    ["space", "/ /evil.example"],
    ["too long", "/" + "a".repeat(600)],
  ];
  for (const [what, value] of refused) {
    it(`falls back to the home page for ${what}`, () => {
      expect(safeNext(value)).toBe("/teams");
      expect(safeNext(value, "/")).toBe("/");
    });
  }

  it("property: for any text, the result is the fallback or a printable-ASCII path that stays on our origin (fast-check)", () => {
    const tricky = fc.constantFrom(
      "/",
      "\\",
      "//",
      "/\t/",
      "%2F",
      "%5C",
      "%09",
      "%0a",
      "。",
      "%E3%80%82",
      ".",
      "..",
      "@",
      ":",
      "?",
      "#",
      "evil.example",
      "\n",
      " ",
    );
    const text = fc.oneof(
      fc.string({ unit: "grapheme", maxLength: 60 }),
      fc.array(tricky, { maxLength: 12 }).map((a) => a.join("")),
    );
    fc.assert(
      fc.property(text, fc.boolean(), (s, withSlash) => {
        const value = withSlash ? `/${s}` : s;
        const out = safeNext(value);
        if (out === "/teams") return;
        expect(out).toMatch(/^\/(?!\/)[\x21-\x5b\x5d-\x7e]*$/);
        for (const origin of ["https://plateau.example", "http://127.0.0.1:4100"]) {
          expect(new URL(out, origin).origin).toBe(origin);
        }
        // Idempotent: a kept path is already in its normal form.
        expect(safeNext(out)).toBe(out);
      }),
      { numRuns: 3000 },
    );
  });
});
