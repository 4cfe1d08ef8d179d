import { describe, expect, it } from "vitest";
import { attachment, csvCell, csvLine, neutraliseFormula } from "@/lib/csv-safe";
import { unneutralise } from "@/lib/import/header";

describe("neutraliseFormula(text)", () => {
  it.each(["=SUM(A1:A2)", "+1", "-2+3", "@cmd", "\tx", "\rx"])("prefixes %j with an apostrophe", (t) => {
    expect(neutraliseFormula(t)).toBe(`'${t}`);
  });
  it("leaves ordinary text alone", () => {
    expect(neutraliseFormula("M2-local")).toBe("M2-local");
    expect(neutraliseFormula("")).toBe("");
  });
  it("is undone by the importer's unneutralise, so exports round-trip", () => {
    for (const t of ['=HYPERLINK("x")', "-local", "@a", "plain", "'quoted"]) expect(unneutralise(neutraliseFormula(t))).toBe(t);
  });
});

describe("csvCell(value) / csvLine(cells)", () => {
  it("writes numbers plainly, negative numbers stay numbers", () => {
    expect(csvCell(-4)).toBe("-4");
    expect(csvCell(2.5e-8)).toBe("2.5e-8");
    expect(csvCell(Number.NaN)).toBe("");
    expect(csvCell(null)).toBe("");
  });
  it("quotes cells with commas, quotes, semicolons and newlines", () => {
    expect(csvCell('a "b", c')).toBe('"a ""b"", c"');
    expect(csvCell("x;y")).toBe('"x;y"');
    expect(csvCell("two\nlines")).toBe('"two\nlines"');
  });
  it("neutralises and quotes a formula that also needs quoting", () => {
    expect(csvCell('=HYPERLINK("http://x","y")')).toBe('"\'=HYPERLINK(""http://x"",""y"")"');
  });
  it("ends lines with CRLF", () => {
    expect(csvLine(["a", 1, null])).toBe("a,1,\r\n");
  });
});

describe("attachment(filename)", () => {
  it("gives an ASCII fallback and the UTF-8 name", () => {
    expect(attachment('Skua "µ" baseline.csv')).toBe(`attachment; filename="Skua ___ baseline.csv"; filename*=UTF-8''Skua%20%22%C2%B5%22%20baseline.csv`);
  });
});
