import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseWireClassCsv } from "@/lib/import/wire-classes";
import { signUpSchema } from "@/lib/validation/auth";
import { baselineCreateSchema } from "@/lib/validation/baseline";
import { composeReportSchema, emailReportSchema } from "@/lib/validation/report";
import { scenarioCreateSchema } from "@/lib/validation/scenario";
import { teamSchema } from "@/lib/validation/team";
import { textProblem } from "@/lib/validation/text";
import { classNameSchema } from "@/lib/validation/wire-class";

// Issue 12 finding 10. OWASP ASVS 4.0.3 5.1.4 (structured data validated against a defined schema, including allowed
// characters); control characters are Unicode general category Cc (C0, DEL, C1); well-formed UTF-16 = every surrogate
// paired (ECMA-262 "String.prototype.isWellFormed"), which is what encodes to valid UTF-8.
const isControl = (c: number) => c < 0x20 || (c >= 0x7f && c <= 0x9f);
const wellFormed = (s: string) => !/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/.test(s);
const codeUnits = (s: string) => [...Array(s.length).keys()].map((i) => s.charCodeAt(i));

describe("textProblem (issue 12 finding 10)", () => {
  it("property: single-line text is accepted exactly when it has no control character and is well-formed (fast-check)", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary", maxLength: 40 }), (s) => {
        const ok = textProblem("Name", s, false) === null;
        expect(ok).toBe(wellFormed(s) && !codeUnits(s).some(isControl));
        // and what is accepted encodes to UTF-8 and back unchanged
        if (ok) expect(new TextDecoder("utf-8", { fatal: true }).decode(new TextEncoder().encode(s))).toBe(s);
      }),
      { numRuns: 2000 },
    );
  });

  it("property: multi-line text also allows tab, LF and CR, nothing else of Cc (fast-check)", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary", maxLength: 40 }), (s) => {
        const ok = textProblem("Notes", s, true) === null;
        expect(ok).toBe(wellFormed(s) && !codeUnits(s).some((c) => isControl(c) && c !== 9 && c !== 10 && c !== 13));
      }),
      { numRuns: 2000 },
    );
  });

  it("names the field, the character and where it is", () => {
    expect(textProblem("Name", "ab\u0000c", false)).toBe("Name must not contain control characters: U+0000 at character 3.");
    expect(textProblem("Notes", "a\u001bb", true)).toBe("Notes must not contain control characters: U+001B at character 2 (tab and line breaks are allowed).");
    expect(textProblem("Name", "x\uD800", false)).toBe("Name is not valid Unicode (an unpaired surrogate U+D800 at character 2).");
    expect(textProblem("Name", "\uDC00", false)).toMatch(/unpaired surrogate U\+DC00 at character 1/);
    expect(textProblem("Name", "a\tb", false)).toMatch(/U\+0009/);
    expect(textProblem("Name", "a\u0085b", false)).toMatch(/U\+0085/);
    expect(textProblem("Notes", "line 1\r\n\tline 2", true)).toBeNull();
    expect(textProblem("Name", "Cu M1 – 😀 ÄÖ 中文", false)).toBeNull();
  });
});

const bad = ["a\u0000b", "a\u0007b", "a\u007fb", "a\uD800b", "a\uDFFFb"];
const issuesOf = (r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  (r.error?.issues ?? []).map((i) => `${i.path.map(String).join(".")}: ${i.message}`);

describe("every text field uses the helper", () => {
  it.each(bad)("%j is refused in every name and note, naming the field", (v) => {
    expect(issuesOf(teamSchema.safeParse({ name: v }))).toEqual([expect.stringMatching(/^name: Team name /)]);
    expect(issuesOf(signUpSchema.safeParse({ email: "a@example.com", password: "correct horse battery", name: v }))).toEqual([
      expect.stringMatching(/^name: Name /),
    ]);
    expect(issuesOf(baselineCreateSchema.safeParse({ name: v }))).toEqual([expect.stringMatching(/^name: Name /)]);
    expect(issuesOf(baselineCreateSchema.safeParse({ name: "ok", description: v }))).toEqual([expect.stringMatching(/^description: Description /)]);
    expect(issuesOf(scenarioCreateSchema.safeParse({ baselineId: "b", name: v }))).toEqual([expect.stringMatching(/^name: Name /)]);
    expect(issuesOf(scenarioCreateSchema.safeParse({ baselineId: "b", name: "ok", notes: v }))).toEqual([expect.stringMatching(/^notes: Notes /)]);
    const compose = { baselineId: "b", scenarioIds: ["s1", "s2"], title: "t" };
    expect(issuesOf(composeReportSchema.safeParse({ ...compose, title: v }))).toEqual([expect.stringMatching(/^title: Title /)]);
    expect(issuesOf(composeReportSchema.safeParse({ ...compose, audienceNote: v }))).toEqual([expect.stringMatching(/^audienceNote: Audience note /)]);
    expect(issuesOf(composeReportSchema.safeParse({ ...compose, classNames: [v] }))).toEqual([expect.stringMatching(/^classNames.0: Class name /)]);
    expect(issuesOf(emailReportSchema.safeParse({ to: ["a@example.com"], message: v }))).toEqual([expect.stringMatching(/^message: Message /)]);
    expect(classNameSchema.safeParse(v).success).toBe(false);
  });

  it("multi-line fields keep tab and line breaks", () => {
    expect(scenarioCreateSchema.parse({ baselineId: "b", name: "ok", notes: "a\n\tb\r\nc" }).notes).toBe("a\n\tb\r\nc");
    expect(scenarioCreateSchema.safeParse({ baselineId: "b", name: "a\nb" }).success).toBe(false);
  });

  it("a CSV class name with a control character is refused with line and column", () => {
    const head =
      "class,tier,width_nm,thickness_nm,spacing_nm,ild_below_nm,ild_above_nm,barrier_nm,metal,k,net_count,mean_length_um,driver_ohm,load_ff,activity\n";
    const r = parseWireClassCsv(`${head}M\u00011,local,20,40,20,30,,2,Cu,2.7,10,5,8000,0.4,0.1\n`);
    expect(r.ok).toBe(false);
    expect(r.errors).toEqual([
      expect.objectContaining({ line: 2, column: "class", message: "Class name must not contain control characters: U+0001 at character 2." }),
    ]);
  });
});
