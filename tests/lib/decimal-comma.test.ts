import { describe, expect, it } from "vitest";
import { parseValue, U } from "@/components/workspace/units";

// Issue 13 item 8 (the editor's fields): "1,55" in the S field names the decimal comma and the fix, not only "Not a number".
describe("parseValue and decimal commas", () => {
  it("says to use a decimal point", () => {
    expect(parseValue("1,55", U.none)).toEqual({ ok: false, message: "Use a decimal point: 1.55, not 1,55 (and no thousands separators)." });
    expect(parseValue("0,02 µm", U.nm)).toEqual({ ok: false, message: "Use a decimal point: 0.02 µm, not 0,02 µm (and no thousands separators)." });
  });
  it("still reads decimal points and other text as before", () => {
    expect(parseValue("1.55", U.none)).toEqual({ ok: true, value: 1.55 });
    expect(parseValue("abc", U.none)).toEqual({ ok: false, message: "Not a number." });
  });
});
